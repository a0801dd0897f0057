/**
 * The viewer in a real browser: Debian's headless Chromium (software GL, SwiftShader) driven by
 * playwright-core against `startViewServer` on a 32^3 fixture run with two dense blobs.
 * Never downloads a browser: /usr/bin/chromium must exist (.ci/run installs it).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { startViewServer, viewerDir, type ViewServer } from '../src/pipeline/view.js';
import { BLOBS, fixtureFields, fixtureSummary, fixtureTree, FIXTURE_CELLS, makePreviewZip, writeFixtureRun } from './helpers/make-preview.js';

const CHROMIUM = '/usr/bin/chromium';
const ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];
const ARTIFACTS = path.resolve(import.meta.dirname, 'artifacts');
const BACKGROUND = [0x10, 0x14, 0x18]; // VIEW_BACKGROUND of viewer/src/colours.ts

/** Pixels of the 3D canvas that differ from the background, and those tinted by the highlight colour. */
async function canvasPixels(page: Page): Promise<{ total: number; lit: number; pink: number }> {
  return page.evaluate((bg) => {
    const gl = document.querySelector('#volume-canvas') as HTMLCanvasElement;
    const c = document.createElement('canvas');
    c.width = gl.width;
    c.height = gl.height;
    const ctx = c.getContext('2d') as CanvasRenderingContext2D;
    ctx.drawImage(gl, 0, 0);
    const d = ctx.getImageData(0, 0, c.width, c.height).data;
    let lit = 0;
    let pink = 0;
    for (let p = 0; p < d.length; p += 4) {
      const diff = Math.max(Math.abs(d[p] - bg[0]), Math.abs(d[p + 1] - bg[1]), Math.abs(d[p + 2] - bg[2]));
      if (diff > 24) lit++;
      if (d[p] > 150 && d[p + 2] > 110 && d[p + 1] < d[p] - 60) pink++;
    }
    return { total: c.width * c.height, lit, pink };
  }, BACKGROUND);
}

describe('viewer page in headless Chromium', () => {
  let dir = '';
  let server: ViewServer | null = null;
  let browser: Browser | null = null;
  let page: Page;
  const requests: string[] = [];

  beforeAll(async () => {
    if (!existsSync(CHROMIUM)) {
      throw new Error(`${CHROMIUM} is missing: the browser test needs Debian's chromium (apt-get install chromium; .ci/run installs it). No browser is downloaded.`);
    }
    if (!existsSync(path.join(viewerDir(), 'viewer.js'))) throw new Error(`the viewer is not built in ${viewerDir()}: run \`npm run build\` first`);
    dir = mkdtempSync(path.join(tmpdir(), 'fragplan-viewer-'));
    await writeFixtureRun(dir, { particles: true });
    server = await startViewServer(dir, { port: 0 });
    browser = await chromium.launch({ executablePath: CHROMIUM, args: ARGS });
    page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    page.on('request', (r) => requests.push(r.url()));
    await page.goto(server.url);
    await page.waitForSelector('body[data-state="ready"]', { timeout: 60_000 });
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it('draws the density volume: the canvas has many non-background pixels, fewer at a high threshold', async () => {
    expect(await page.evaluate(() => window.fragplanViewer?.webgl)).toBe(true);
    const low = await canvasPixels(page);
    expect(low.lit / low.total).toBeGreaterThan(0.02);
    await page.locator('#threshold').fill('0.95');
    const high = await canvasPixels(page);
    expect(high.lit).toBeLessThan(low.lit);
    await page.locator('#threshold').fill('0.35');
  });

  it('lists the run\'s node count in the tree panel, one button per node', async () => {
    const nodes = fixtureSummary().hierarchy.nodes as number;
    await expect(page.locator('#tree-count').textContent()).resolves.toBe(`Tree: ${nodes} nodes`);
    expect(await page.locator('#tree-panel button.node').count()).toBe(nodes);
  });

  it('clicking a tree node lights its cells and its descendants\' cells', async () => {
    // node 3 holds leaves 0 and 2 in the fixture tree: count its labelled cells independently
    const { labels } = fixtureFields();
    const subtree = new Set([3, 0, 2]);
    let expected = 0;
    for (const l of labels) if (subtree.has(l)) expected++;
    expect(expected).toBeGreaterThan(0);
    const before = await canvasPixels(page);
    await page.locator('#tree-panel button.node[data-node="3"]').click();
    await expect(page.locator('#pick-info').textContent()).resolves.toContain(`${expected} preview cells lit`);
    const after = await canvasPixels(page);
    expect(after.pink).toBeGreaterThan(before.pink + 20);
    await page.screenshot({ path: path.join(ARTIFACTS, 'viewer-highlight.png'), fullPage: true });
    await page.locator('#tree-panel button.node[data-node="3"]').click(); // clears
    await expect(page.locator('#pick-info').textContent()).resolves.toBe('Selection cleared.');
  });

  it('clicking a candidate marker in 3D shows its mass; hovering shows it too', async () => {
    const tree = fixtureTree();
    for (const b of BLOBS) {
      const node = tree.find((n) => n.id === b.node);
      const pos = await page.evaluate((id) => window.fragplanViewer?.candidateScreenPosition(id) ?? null, b.node);
      expect(pos).not.toBeNull();
      await page.mouse.move(pos!.x, pos!.y);
      await expect(page.locator('#hover-tip').textContent()).resolves.toContain(`${node!.mass_msun} Msun`);
      await page.mouse.click(pos!.x, pos!.y);
      const text = await page.locator('#pick-info').textContent();
      expect(text).toContain(`Candidate #${b.node}: ${node!.mass_msun} Msun`);
    }
    mkdirSync(ARTIFACTS, { recursive: true });
    await page.screenshot({ path: path.join(ARTIFACTS, 'viewer.png'), fullPage: true });
    expect(existsSync(path.join(ARTIFACTS, 'viewer.png'))).toBe(true);
  });

  it('the Jeans slice reports the cells above the 1/4 limit in the shown slice', async () => {
    // Truelove et al. 1997: J <= 1/4; count over-limit cells of the chosen z slice from the fixture
    const { jeans } = fixtureFields();
    const n = FIXTURE_CELLS;
    const s = Number(await page.locator('#slice-index').inputValue());
    let above = 0;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (jeans[(i * n + j) * n + s] > 0.25) above++;
    expect(above).toBeGreaterThan(0);
    await expect(page.locator('#slice-label').textContent()).resolves.toContain(`${above} cells above J = 0.25`);
    await page.locator('#slice-index').fill('0');
    await expect(page.locator('#slice-label').textContent()).resolves.toContain('0 cells above');
  });

  it('opens a preview.zip chosen with the file picker (no server fetch needed)', async () => {
    const other = path.join(dir, 'other-run.zip');
    writeFileSync(other, await makePreviewZip({ fragmentsCsv: 'id,mass_msun\n0,12.5\n1,4.75\n' }));
    await page.locator('#file-input').setInputFiles(other);
    await expect.poll(() => page.locator('#status').textContent()).toContain('other-run.zip: 32^3 preview');
    await expect(page.locator('#tree-count').textContent()).resolves.toBe(`Tree: ${fixtureTree().length} nodes`);
    // a broken file gets a message, not a crash
    const broken = path.join(dir, 'broken.zip');
    writeFileSync(broken, 'not a zip');
    await page.locator('#file-input').setInputFiles(broken);
    await expect.poll(() => page.locator('#status').textContent()).toContain('Could not read broken.zip: this file is not a zip archive');
  });

  it('shows the mass spectrum with the model curve, and made no request off its own server', async () => {
    await expect(page.locator('#mass-plot svg').count()).resolves.toBe(1);
    await expect(page.locator('#mass-plot').textContent()).resolves.toContain('Salpeter');
    expect(requests.length).toBeGreaterThan(0);
    for (const u of requests) expect(u.startsWith(server!.url) || u.startsWith('data:') || u.startsWith('blob:')).toBe(true);
  });
});

describe('viewer page without WebGL', () => {
  it('shows a clear message instead of the 3D view and keeps the other panels', async () => {
    if (!existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: install Debian's chromium (apt-get install chromium).`);
    const dir = mkdtempSync(path.join(tmpdir(), 'fragplan-viewer-nogl-'));
    await writeFixtureRun(dir);
    const server = await startViewServer(dir);
    const browser = await chromium.launch({ executablePath: CHROMIUM, args: [...ARGS, '--disable-3d-apis'] });
    try {
      const page = await browser.newPage();
      const errors: string[] = [];
      page.on('pageerror', (e) => errors.push(e.message));
      await page.goto(server.url);
      await page.waitForSelector('body[data-state="ready"]', { timeout: 60_000 });
      await expect(page.locator('#gl-message').isVisible()).resolves.toBe(true);
      await expect(page.locator('#gl-message').textContent()).resolves.toContain('WebGL2 is not available');
      await expect(page.locator('#tree-count').textContent()).resolves.toBe(`Tree: ${fixtureTree().length} nodes`);
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
      await server.close();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
