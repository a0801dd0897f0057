/**
 * viewer/src/preview-data.ts and load-zip.ts: decoding preview.zip, tree subtrees, cell masks,
 * candidate positions. Grid convention: C order (i*n + j)*n + k, i along x, cell-centred,
 * box [-L/2, L/2)^3 in pc.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { decodePreview, fillMask, labelCentroid, logDensityBytes, parseCsv, positionsFromCsv, positiveRange, subtreeIds } from '../viewer/src/preview-data.js';
import { openPreview } from '../viewer/src/load-zip.js';
import { readFileSync } from 'node:fs';
import { readPreview, writePreview } from '../src/export/preview.js';
import type { Cloud } from '../src/generate/cloud.js';
import { PC } from '../src/physics/constants.js';
import { BLOBS, FIXTURE_BOX_PC, FIXTURE_CELLS, fixtureFields, fixtureTree, makePreviewZip } from './helpers/make-preview.js';

describe('parseCsv', () => {
  it('handles empty text, quotes with commas and doubled quotes, and lower-cases the header', () => {
    expect(parseCsv('')).toEqual({ header: [], rows: [] });
    const t = parseCsv('ID,Name\n1,"a, b"\n2,"say ""hi"""\n');
    expect(t.header).toEqual(['id', 'name']);
    expect(t.rows).toEqual([['1', 'a, b'], ['2', 'say "hi"']]);
  });
});

describe('positionsFromCsv', () => {
  it('reads id and x/y/z in pc from the fragments.csv header the survey writes', () => {
    const csv = 'id,mass_msun,x_pc,y_pc,z_pc,effective_radius_pc,cells,state\n4,2.5,0.1,-0.2,0.3,0.05,12,stable\n';
    expect(positionsFromCsv(csv).get(4)).toEqual([0.1, -0.2, 0.3]);
    expect(positionsFromCsv('id,mass_msun\n4,2.5\n').size).toBe(0);
    expect(positionsFromCsv(null).size).toBe(0);
  });
});

describe('subtrees and masks', () => {
  const tree = fixtureTree();
  it('a node\'s subtree is itself and all its descendants', () => {
    expect([...subtreeIds(tree, 3)].sort()).toEqual([0, 2, 3]);
    expect([...subtreeIds(tree, 0)]).toEqual([0]);
    expect(subtreeIds(tree, 6).size).toBe(tree.length);
    expect([...subtreeIds([], 9)]).toEqual([9]);
  });
  it('fillMask marks exactly the cells labelled with the subtree', () => {
    const labels = Int32Array.from([-1, 0, 2, 3, 1, 4, 0, -1]);
    const out = new Uint8Array(labels.length);
    expect(fillMask(labels, new Set([0, 2, 3]), out)).toBe(4);
    expect([...out]).toEqual([0, 255, 255, 255, 0, 0, 255, 0]);
    expect(fillMask(labels, new Set(), out)).toBe(0);
  });
});

describe('labelCentroid', () => {
  it('one labelled cell: its cell centre; none: null', () => {
    const n = 4;
    const L = 2;
    const labels = new Int32Array(n ** 3).fill(-1);
    const density = new Float32Array(n ** 3).fill(1);
    expect(labelCentroid(labels, density, n, L, new Set([1]))).toBeNull();
    const [i, j, k] = [3, 0, 1];
    labels[(i * n + j) * n + k] = 1;
    const dx = L / n;
    expect(labelCentroid(labels, density, n, L, new Set([1]))).toEqual([-L / 2 + (i + 0.5) * dx, -L / 2 + (j + 0.5) * dx, -L / 2 + (k + 0.5) * dx]);
  });
  it('finds each fixture blob near its centre (within one cell)', () => {
    const { labels, density } = fixtureFields();
    for (const b of BLOBS) {
      const c = labelCentroid(labels, density, FIXTURE_CELLS, FIXTURE_BOX_PC, new Set([b.node]))!;
      for (let a = 0; a < 3; a++) expect(Math.abs(c[a] - b.centre[a])).toBeLessThan(FIXTURE_BOX_PC / FIXTURE_CELLS);
    }
  });
});

describe('logDensityBytes', () => {
  it('maps lo to 0, hi to 255, the geometric mean to the middle, and non-positive to 0', () => {
    const d = Float32Array.from([1e-20, 1e-18, 1e-19, 0, -1, 1e-22, 1e-16]);
    const b = [...logDensityBytes(d, 1e-20, 1e-18)];
    expect(b[1 - 1]).toBe(0);
    expect(b[1]).toBe(255);
    expect([127, 128]).toContain(b[2]); // 127.5 up to float32 rounding of 1e-19
    expect(b.slice(3)).toEqual([0, 0, 0, 255]);
    expect(positiveRange(Float32Array.from([0, -2]))).toBeNull();
    expect(positiveRange(Float32Array.from([0, 3, 0.5]))).toEqual([0.5, 3]);
  });
});

describe('decodePreview / openPreview', () => {
  it('opens the fixture preview.zip: fields, tree, candidates placed from fragments.csv', async () => {
    const data = await openPreview(await makePreviewZip({ particles: true }));
    expect(data.n).toBe(FIXTURE_CELLS);
    expect(data.density.length).toBe(FIXTURE_CELLS ** 3);
    expect(data.particles?.length).toBe(1500);
    expect(data.tree.length).toBe(fixtureTree().length);
    expect(data.candidates.map((c) => c.id)).toEqual([0, 1]);
    expect(data.candidates[0].position).toEqual([...BLOBS[0].centre]);
    const { density } = fixtureFields();
    expect(data.density[12345]).toBe(density[12345]);
  });

  it('falls back to the labelled cells\' centre when fragments.csv has no positions', async () => {
    const data = await openPreview(await makePreviewZip({ fragmentsCsv: 'id,mass_msun\n0,12.5\n1,4.75\n' }));
    for (const [i, c] of data.candidates.entries()) {
      for (let a = 0; a < 3; a++) expect(Math.abs(c.position[a] - BLOBS[i].centre[a])).toBeLessThan(FIXTURE_BOX_PC / FIXTURE_CELLS);
    }
  });

  it('refuses a non-zip, a wrong schema and a field of the wrong size, naming the entry', async () => {
    await expect(openPreview(new TextEncoder().encode('hello'))).rejects.toThrow(/not a zip/);
    const text = (o: Record<string, string>) => (n: string) => o[n] ?? null;
    const manifest = { schema: 'fragplan.preview/1', cells: 2, box_size_pc: 1, fields: { density: { file: 'density.f32' }, jeans: { file: 'jeans.f32' }, labels: { file: 'labels.i32' } }, particles: null };
    expect(() => decodePreview({ text: text({ 'preview.json': '{"schema":"other"}' }), bytes: () => null })).toThrow(/schema/);
    expect(() => decodePreview({ text: text({}), bytes: () => null })).toThrow(/no preview\.json/);
    expect(() => decodePreview({ text: text({ 'preview.json': JSON.stringify(manifest) }), bytes: (n) => (n === 'density.f32' ? new Uint8Array(31) : new Uint8Array(32)) })).toThrow(/density\.f32: 31 bytes, expected 32/);
    expect(() => decodePreview({ text: text({ 'preview.json': JSON.stringify(manifest) }), bytes: (n) => (n === 'jeans.f32' ? null : new Uint8Array(32)) })).toThrow(/no jeans\.f32/);
  });

  it('the fixture follows the preview layout: the project\'s own reader (readPreview) accepts it', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'fragplan-fixture-'));
    try {
      const file = path.join(dir, 'preview.zip');
      writeFileSync(file, await makePreviewZip({ particles: true }));
      const b = await readPreview(file);
      expect(b.manifest.cells).toBe(FIXTURE_CELLS);
      expect(b.particles?.length).toBe(1500);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('decodes a preview.zip written by the project\'s writer (writePreview), downsampled 2x', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'fragplan-writer-'));
    try {
      const full = fixtureFields(32); // stand-in full grid; the preview keeps 16^3
      const cloud = { grid: { nx: 32, ny: 32, nz: 32, boxSize: FIXTURE_BOX_PC * PC.value }, density: full.density, seed: 7 } as unknown as Cloud;
      const csv = 'id,mass_msun,x_pc,y_pc,z_pc,state\n0,12.5,-0.45,-0.1,0.05,bound-unstable\n';
      const file = path.join(dir, 'preview.zip');
      await writePreview(file, { cloud, jeansNumber: full.jeans, labels: full.labels, summary: {}, tree: { nodes: fixtureTree() }, fragmentsCsv: csv, plots: { schema: 'fragplan.plots/1', tree: fixtureTree() }, previewCells: 16, toolVersion: '0.1.0' }, false);
      const data = await openPreview(readFileSync(file));
      expect(data.n).toBe(16);
      expect(data.manifest.source_cells).toBe(32);
      expect(data.boxPc).toBeCloseTo(FIXTURE_BOX_PC, 12);
      // block mean of the first 2x2x2 block, C order
      let sum = 0;
      for (const [i, j, k] of [[0, 0, 0], [0, 0, 1], [0, 1, 0], [0, 1, 1], [1, 0, 0], [1, 0, 1], [1, 1, 0], [1, 1, 1]]) sum += full.density[(i * 32 + j) * 32 + k];
      expect(Math.abs(data.density[0] - sum / 8) / (sum / 8)).toBeLessThan(1e-6); // float32 storage
      expect(data.candidates.find((c) => c.id === 0)?.position).toEqual([-0.45, -0.1, 0.05]);
      // candidate 1 is not in the CSV: placed at its labelled cells' centre instead
      const c1 = data.candidates.find((c) => c.id === 1)!;
      for (let a = 0; a < 3; a++) expect(Math.abs(c1.position[a] - BLOBS[1].centre[a])).toBeLessThan(FIXTURE_BOX_PC / 16);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
