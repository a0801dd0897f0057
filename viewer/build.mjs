// Builds the command-line tool, its worker script and the viewer into dist/ with esbuild (dependencies
// bundled, except h5wasm).
// Run by `npm install` (prepare), `npm test` (pretest) and `npm run build`.
import { build } from 'esbuild';
import { mkdir, copyFile, rm } from 'node:fs/promises';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const r = (p) => path.join(root, p);

// start clean so stale chunks never pile up
await rm(r('dist'), { recursive: true, force: true });

await build({
  entryPoints: { cli: r('src/cli.ts'), index: r('src/index.ts'), worker: r('src/worker.ts') },
  outdir: r('dist'),
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  // dependencies are bundled too (fewer files to resolve and compile at start-up: the CLI and each
  // worker thread start ~50 ms sooner); h5wasm loads its .wasm beside its own files, so it stays out
  external: ['h5wasm'],
  splitting: true,
  chunkNames: 'chunk-[name]-[hash]',
  // bundled CommonJS dependencies (yaml, commander) call require(): give ESM chunks one
  banner: { js: "import { createRequire as __fragplanCreateRequire } from 'node:module'; const require = __fragplanCreateRequire(import.meta.url);" },
  logLevel: 'warning',
});

// The viewer (three.js page): a missing source is an error, not a skipped step.
for (const f of ['viewer/src/main.ts', 'viewer/index.html', 'viewer/style.css']) {
  if (!existsSync(r(f))) {
    console.error(`${f} not found: cannot build the viewer`);
    process.exit(1);
  }
}
await mkdir(r('dist/viewer'), { recursive: true });
await build({
  entryPoints: [r('viewer/src/main.ts')],
  outfile: r('dist/viewer/viewer.js'),
  bundle: true,
  platform: 'browser',
  format: 'esm',
  target: 'es2022',
  minify: true,
  legalComments: 'none',
  logLevel: 'warning',
});
await copyFile(r('viewer/index.html'), r('dist/viewer/index.html'));
await copyFile(r('viewer/style.css'), r('dist/viewer/style.css'));
