// Builds the command-line tool, its worker script and the viewer into dist/ with esbuild.
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
  packages: 'external',
  splitting: true,
  chunkNames: 'chunk-[name]-[hash]',
  banner: { js: '' },
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
