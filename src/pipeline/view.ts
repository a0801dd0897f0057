/**
 * `fragplan view`: a small HTTP server on 127.0.0.1 that serves the built viewer (dist/viewer)
 * and one run's preview.zip (and report.html when the run has one), and nothing else.
 * Routes: /, /index.html and the viewer's own files; /run/preview.zip; /run/report.html.
 * Any path that decodes to a ".." segment, a backslash or a NUL byte is refused (403); anything
 * else not listed is 404. Only GET and HEAD.
 */
import http from 'node:http';
import { existsSync, readFileSync, statSync, openSync, readSync, closeSync, realpathSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { InputError } from '../input-error.js';

/** A running view server. */
export interface ViewServer {
  /** e.g. http://127.0.0.1:40123/ */
  url: string;
  server: http.Server;
  close(): Promise<void>;
}

/**
 * Folder of the built viewer: dist/viewer, found from this module's place (src/pipeline/ under
 * tests, dist/ or a bundle chunk in dist/chunks/ when built).
 */
export function viewerDir(): string {
  const here = path.dirname(fileURLToPath(import.meta.url));
  const candidates = [
    path.join(here, 'viewer'),
    path.join(here, '..', 'viewer'),
    path.join(here, '..', '..', 'dist', 'viewer'),
    path.join(here, '..', 'dist', 'viewer'),
  ];
  return candidates.find((c) => existsSync(path.join(c, 'index.html')) && existsSync(path.join(c, 'viewer.js'))) ?? candidates[2];
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.zip': 'application/zip',
  '.png': 'image/png',
  '.svg': 'image/svg+xml',
  '.map': 'application/json',
};

/** The run files a target provides: its preview.zip and, for a run folder, report.html if present. */
export function resolveViewTarget(target: string): { zip: string; report: string | null } {
  if (!existsSync(target)) throw new InputError(`view target ${target} not found (expected a run folder or a preview.zip)`);
  const st = statSync(target);
  let zip: string;
  let report: string | null = null;
  if (st.isDirectory()) {
    zip = path.join(target, 'preview.zip');
    if (!existsSync(zip)) throw new InputError(`${zip} not found: run \`fragplan plan\` first (the viewer loads the run's preview.zip)`);
    const r = path.join(target, 'report.html');
    if (existsSync(r) && statSync(r).isFile()) report = realpathSync(r);
  } else {
    zip = target;
  }
  if (!statSync(zip).isFile()) throw new InputError(`${zip} is not a file (expected preview.zip)`);
  const head = Buffer.alloc(4);
  const fd = openSync(zip, 'r');
  const got = readSync(fd, head, 0, 4, 0);
  closeSync(fd);
  if (got < 4 || head.readUInt32LE(0) !== 0x04034b50) throw new InputError(`${zip} is not a zip file (expected the preview.zip that \`fragplan plan\` writes)`);
  return { zip: realpathSync(zip), report };
}

/**
 * Maps a request path to a file, or an HTTP status when refused: 403 for traversal attempts
 * (".." segments, backslashes, NUL, bad encoding), 404 for anything not served.
 */
export function routeRequest(rawPath: string, root: string, run: { zip: string; report: string | null }): { file: string } | { status: 403 | 404 } {
  const q = rawPath.indexOf('?');
  const p0 = q >= 0 ? rawPath.slice(0, q) : rawPath;
  let decoded: string;
  try {
    decoded = decodeURIComponent(p0);
  } catch {
    return { status: 403 };
  }
  if (!decoded.startsWith('/') || decoded.includes('\0') || decoded.includes('\\')) return { status: 403 };
  const segments = decoded.split('/');
  if (segments.some((s) => s === '..' || s === '.')) return { status: 403 };
  const clean = path.posix.normalize(decoded);
  if (clean === '/run/preview.zip') return { file: run.zip };
  if (clean === '/run/report.html') return run.report ? { file: run.report } : { status: 404 };
  const rel = clean === '/' ? 'index.html' : clean.slice(1);
  if (rel.startsWith('run/')) return { status: 404 };
  const file = path.resolve(root, rel);
  const rootAbs = path.resolve(root);
  if (file !== rootAbs && !file.startsWith(rootAbs + path.sep)) return { status: 403 };
  if (!existsSync(file) || !statSync(file).isFile()) return { status: 404 };
  // a symlink inside the viewer folder must not lead out of it
  const real = realpathSync(file);
  const realRoot = realpathSync(rootAbs);
  if (!real.startsWith(realRoot + path.sep)) return { status: 403 };
  return { file: real };
}

/** Starts the server on 127.0.0.1 (a free port when port is 0 or absent) for a run folder or preview.zip. */
export async function startViewServer(target: string, opts: { port?: number; host?: '127.0.0.1' } = {}): Promise<ViewServer> {
  const run = resolveViewTarget(target);
  const root = viewerDir();
  if (!existsSync(path.join(root, 'viewer.js'))) {
    throw new Error(`the viewer is not built (${path.join(root, 'viewer.js')} missing): run \`npm run build\``);
  }
  const host = '127.0.0.1';
  const server = http.createServer((req, res) => {
    const method = req.method ?? 'GET';
    const headers = { 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' };
    if (method !== 'GET' && method !== 'HEAD') {
      res.writeHead(405, { ...headers, Allow: 'GET, HEAD', 'Content-Type': 'text/plain' });
      res.end('method not allowed\n');
      return;
    }
    const r = routeRequest(req.url ?? '/', root, run);
    if ('status' in r) {
      res.writeHead(r.status, { ...headers, 'Content-Type': 'text/plain' });
      res.end(r.status === 403 ? 'forbidden\n' : 'not found\n');
      return;
    }
    let body: Buffer;
    try {
      body = readFileSync(r.file);
    } catch {
      res.writeHead(404, { ...headers, 'Content-Type': 'text/plain' });
      res.end('not found\n');
      return;
    }
    const type = TYPES[path.extname(r.file).toLowerCase()] ?? 'application/octet-stream';
    res.writeHead(200, { ...headers, 'Content-Type': type, 'Content-Length': body.length });
    res.end(method === 'HEAD' ? undefined : body);
  });
  await new Promise<void>((resolve, reject) => {
    const onError = (e: NodeJS.ErrnoException) => {
      server.off('listening', onListening);
      if (e.code === 'EADDRINUSE') reject(new InputError(`--port ${opts.port}: port already in use (expected a free port, or omit --port)`));
      else reject(e);
    };
    const onListening = () => {
      server.off('error', onError);
      resolve();
    };
    server.once('error', onError);
    server.once('listening', onListening);
    server.listen(opts.port ?? 0, host);
  });
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : 0;
  return {
    url: `http://${host}:${port}/`,
    server,
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.close((e) => (e ? reject(e) : resolve()));
        server.closeAllConnections();
      }),
  };
}
