/**
 * `startViewServer` (src/pipeline/view.ts): loopback only, serves the viewer and the one run,
 * refuses every path outside (plain, percent-encoded, backslash, NUL), validates its target.
 * Needs the built viewer in dist/viewer (`npm run build`; `npm test` builds it first).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import http from 'node:http';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { resolveViewTarget, routeRequest, startViewServer, type ViewServer } from '../src/pipeline/view.js';
import { InputError } from '../src/input-error.js';
import { writeFixtureRun } from './helpers/make-preview.js';

/** Sends a raw request path (no client-side normalisation) and returns status and body. */
function get(url: string, rawPath: string, method = 'GET'): Promise<{ status: number; body: Buffer; type: string }> {
  const u = new URL(url);
  return new Promise((resolve, reject) => {
    const req = http.request({ host: u.hostname, port: u.port, path: rawPath, method }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks), type: String(res.headers['content-type'] ?? '') }));
    });
    req.on('error', reject);
    req.end();
  });
}

const TRAVERSALS = [
  '/../package.json',
  '/../../package.json',
  '/%2e%2e/package.json',
  '/%2E%2E/%2E%2E/package.json',
  '/..%2fpackage.json',
  '/%2e%2e%2fpackage.json',
  '/%2e%2e%2f%2e%2e%2fpackage.json',
  '/run/../../package.json',
  '/run/%2e%2e/summary.json',
  '/..\\package.json',
  '/%5c..%5cpackage.json',
  '/.%2e/package.json',
  '/index.html%00.png',
  '/%E0%A4%A',
  '//etc/passwd',
  '/./index.html/../../package.json',
];

describe('view server target validation', () => {
  it('refuses a missing target, a folder without preview.zip and a file that is not a zip, naming the file', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'fragplan-view-bad-'));
    try {
      expect(() => resolveViewTarget(path.join(dir, 'nope'))).toThrow(InputError);
      expect(() => resolveViewTarget(dir)).toThrow(/preview\.zip not found/);
      const fake = path.join(dir, 'fake.zip');
      writeFileSync(fake, 'not a zip at all');
      expect(() => resolveViewTarget(fake)).toThrow(InputError);
      expect(() => resolveViewTarget(fake)).toThrow(/fake\.zip is not a zip/);
      await expect(startViewServer(dir)).rejects.toThrow(InputError);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('view server routes', () => {
  let dir = '';
  let server: ViewServer;

  beforeAll(async () => {
    dir = mkdtempSync(path.join(tmpdir(), 'fragplan-view-'));
    await writeFixtureRun(path.join(dir, 'run'), { report: '<!DOCTYPE html><title>r</title>' });
    writeFileSync(path.join(dir, 'secret.txt'), 'outside the run');
    server = await startViewServer(path.join(dir, 'run'), { port: 0 });
  });
  afterAll(async () => {
    await server?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('listens on 127.0.0.1 only, on a free port', () => {
    const a = server.server.address();
    expect(a).not.toBeNull();
    expect(typeof a).toBe('object');
    const addr = a as { address: string; family: string; port: number };
    expect(addr.address).toBe('127.0.0.1');
    expect(addr.port).toBeGreaterThan(0);
    expect(server.url).toBe(`http://127.0.0.1:${addr.port}/`);
  });

  it('serves the viewer page, its script, the run\'s preview.zip and report.html', async () => {
    const index = await get(server.url, '/');
    expect(index.status).toBe(200);
    expect(index.type).toContain('text/html');
    expect(index.body.toString()).toContain('fragplan viewer');
    const js = await get(server.url, '/viewer.js');
    expect(js.status).toBe(200);
    expect(js.type).toContain('javascript');
    const zip = await get(server.url, '/run/preview.zip');
    expect(zip.status).toBe(200);
    expect(zip.body.equals(readFileSync(path.join(dir, 'run', 'preview.zip')))).toBe(true);
    const report = await get(server.url, '/run/report.html?x=1');
    expect(report.status).toBe(200);
    expect(report.body.toString()).toContain('<title>r</title>');
  });

  it('serves nothing else of the run folder', async () => {
    for (const p of ['/run/summary.json', '/summary.json', '/run/', '/run', '/secret.txt', '/run/secret.txt']) {
      const r = await get(server.url, p);
      expect([403, 404], p).toContain(r.status);
    }
  });

  it.each(TRAVERSALS)('refuses %s with 403 or 404 and leaks nothing', async (p) => {
    const r = await get(server.url, p);
    expect([400, 403, 404]).toContain(r.status);
    const text = r.body.toString();
    expect(text).not.toContain('"name": "fragplan"');
    expect(text).not.toContain('root:');
    expect(text).not.toContain('two-blobs');
  });

  it('allows only GET and HEAD', async () => {
    expect((await get(server.url, '/', 'POST')).status).toBe(405);
    expect((await get(server.url, '/', 'DELETE')).status).toBe(405);
    const head = await get(server.url, '/', 'HEAD');
    expect(head.status).toBe(200);
    expect(head.body.length).toBe(0);
  });

  it('refuses a port that is taken with an InputError', async () => {
    const port = (server.server.address() as { port: number }).port;
    await expect(startViewServer(path.join(dir, 'run'), { port })).rejects.toThrow(/--port/);
  });
});

describe('routeRequest', () => {
  const run = { zip: '/r/preview.zip', report: null };
  it('maps the run routes and refuses the report when the run has none', () => {
    expect(routeRequest('/run/preview.zip', '/nonexistent-root', run)).toEqual({ file: '/r/preview.zip' });
    expect(routeRequest('/run/report.html', '/nonexistent-root', run)).toEqual({ status: 404 });
  });
  it('returns 403 for dot segments before any file lookup', () => {
    expect(routeRequest('/a/../b', '/nonexistent-root', run)).toEqual({ status: 403 });
    expect(routeRequest('/%2e%2e', '/nonexistent-root', run)).toEqual({ status: 403 });
  });
});

describe('a zip given directly', () => {
  it('serves that zip and no report; close() stops the server', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'fragplan-view-zip-'));
    try {
      await writeFixtureRun(dir, { report: 'x' });
      mkdirSync(path.join(dir, 'sub'));
      const s = await startViewServer(path.join(dir, 'preview.zip'));
      expect((await get(s.url, '/run/preview.zip')).status).toBe(200);
      expect((await get(s.url, '/run/report.html')).status).toBe(404);
      await s.close();
      await expect(get(s.url, '/')).rejects.toThrow();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
