/**
 * preview.zip: writer follows src/export/preview-layout.ts; reader validates entry names, sizes and
 * values; bytes are reproducible. Block means are recomputed here independently.
 */
import { describe, expect, it, beforeEach, afterEach } from 'vitest';
import { mkdtempSync, rmSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import JSZip from 'jszip';
import { fixtureCloud } from './helpers/export-cloud.js';
import { writePreview, readPreview, previewSize, previewBlocks, ZIP_DATE } from '../src/export/preview.js';
import { PC } from '../src/physics/constants.js';
import { InputError } from '../src/input-error.js';

function parts(n: number, previewCells: number, particles: Float64Array | null = null) {
  const cloud = fixtureCloud({ n });
  const N = n ** 3;
  const jeansNumber = new Float32Array(N).map((_, q) => (q % 97) / 400);
  const labels = new Int32Array(N).map((_, q) => (cloud.inside[q] ? q % 5 : -1));
  return {
    cloud, jeansNumber, labels, summary: { schema: 'fragplan.summary/1', seed: 11 }, tree: { nodes: [] },
    fragmentsCsv: 'id,mass_msun\n', plots: { pdf: [1, 2] }, particles, previewCells, toolVersion: '0.1.0',
  };
}

describe('previewSize', () => {
  it('is the largest divisor of n not above the request', () => {
    expect(previewSize(1, 64)).toBe(1);
    expect(previewSize(64, 64)).toBe(64);
    expect(previewSize(256, 64)).toBe(64);
    expect(previewSize(48, 32)).toBe(24);
    expect(previewSize(16, 64)).toBe(16);
  });
});

describe('writePreview and readPreview', () => {
  let dir: string;
  beforeEach(() => { dir = mkdtempSync(path.join(tmpdir(), 'fragplan-preview-')); });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('round-trips: block-mean density, block-max Jeans number, label of the densest cell, particles in pc', async () => {
    const n = 8, c = 4, b = 2;
    const pos = new Float64Array([PC.value, -PC.value, 0.5 * PC.value, 0, 0, 0]);
    const p = parts(n, c, pos);
    const zip = path.join(dir, 'preview.zip');
    await writePreview(zip, p, false);
    const r = await readPreview(zip);
    expect(r.manifest.schema).toBe('fragplan.preview/1');
    expect(r.manifest.cells).toBe(c);
    expect(r.manifest.source_cells).toBe(n);
    expect(r.manifest.box_size_pc).toBeCloseTo(p.cloud.grid.boxSize / PC.value, 12);
    for (let I = 0; I < c; I++) for (let J = 0; J < c; J++) for (let K = 0; K < c; K++) {
      let sum = 0, jmax = -Infinity, peak = -Infinity, label = -1;
      for (let i = I * b; i < I * b + b; i++) for (let j = J * b; j < J * b + b; j++) for (let k = K * b; k < K * b + b; k++) {
        const q = (i * n + j) * n + k;
        sum += p.cloud.density[q]!;
        jmax = Math.max(jmax, p.jeansNumber[q]!);
        if (p.cloud.density[q]! > peak) { peak = p.cloud.density[q]!; label = p.labels[q]!; }
      }
      const Q = (I * c + J) * c + K;
      expect(r.density[Q]).toBeCloseTo(Math.fround(sum / 8), 30);
      expect(Math.abs(r.density[Q]! / (sum / 8) - 1)).toBeLessThan(1e-6);
      expect(r.jeans[Q]).toBe(jmax);
      expect(r.labels[Q]).toBe(label);
    }
    expect(r.manifest.fields.density.max).toBe(Math.max(...r.density));
    expect(Array.from(r.particles!)).toEqual([1, -1, 0.5, 0, 0, 0].map(Math.fround));
    expect(r.manifest.particles).toEqual({ file: 'particles.f32', count: 2, unit: 'pc' });
    expect(r.fragmentsCsv).toBe('id,mass_msun\n');
    expect(r.summary).toEqual(p.summary);
  });

  it('gives the same bytes with its label-free block reductions made beforehand (previewBlocks), and refuses blocks of another size', async () => {
    const p = parts(8, 4);
    const a = path.join(dir, 'a.zip'), b = path.join(dir, 'b.zip');
    const ha = await writePreview(a, p, false);
    const hb = await writePreview(b, { ...p, blocks: previewBlocks(8, 4, p.cloud.density, p.jeansNumber) }, false);
    expect(hb).toBe(ha);
    expect(readFileSync(b).equals(readFileSync(a))).toBe(true);
    await expect(writePreview(path.join(dir, 'c.zip'), { ...p, blocks: previewBlocks(8, 2, p.cloud.density, p.jeansNumber) }, false)).rejects.toThrow(RangeError);
  });

  it('writes the same bytes twice, dates every entry 1980-01-01 and refuses to replace without force', async () => {
    const a = path.join(dir, 'a.zip');
    const b = path.join(dir, 'b.zip');
    const p = parts(8, 4);
    const ha = await writePreview(a, p, false);
    await new Promise((res) => setTimeout(res, 1100));
    const hb = await writePreview(b, p, false);
    expect(ha).toBe(hb);
    expect(readFileSync(a)).toEqual(readFileSync(b));
    const z = await JSZip.loadAsync(readFileSync(a));
    for (const e of Object.values(z.files)) expect(e.date.getTime()).toBe(ZIP_DATE.getTime());
    expect(Object.keys(z.files)).toEqual(['preview.json', 'density.f32', 'jeans.f32', 'labels.i32', 'summary.json', 'tree.json', 'fragments.csv', 'plots.json']);
    await expect(writePreview(a, p, false)).rejects.toThrow(InputError);
    await writePreview(a, p, true);
  });

  it('subsamples more than 100 000 particles', async () => {
    const pos = new Float64Array(250_001 * 3);
    const zip = path.join(dir, 'p.zip');
    await writePreview(zip, parts(4, 4, pos), false);
    const r = await readPreview(zip);
    expect(r.manifest.particles!.count).toBeLessThanOrEqual(100_000);
    expect(r.particles!.length).toBe(r.manifest.particles!.count * 3);
  });

  async function tampered(edit: (z: JSZip) => void | Promise<void>): Promise<string> {
    const good = path.join(dir, 'good.zip');
    await writePreview(good, parts(4, 4), true);
    const z = await JSZip.loadAsync(readFileSync(good));
    await edit(z);
    const out = path.join(dir, 'bad.zip');
    writeFileSync(out, await z.generateAsync({ type: 'uint8array' }));
    return out;
  }

  it('rejects entries that would escape the folder, unknown entries, wrong sizes and bad values', async () => {
    await expect(readPreview(await tampered((z) => { z.file('../evil.txt', 'x'); }))).rejects.toThrow(/unexpected entry/);
    await expect(readPreview(await tampered((z) => { z.file('sub/density.f32', 'x'); }))).rejects.toThrow(InputError);
    await expect(readPreview(await tampered((z) => { z.file('density.f32', new Uint8Array(12)); }))).rejects.toThrow(/density.f32 holds 12 bytes, expected 256/);
    await expect(readPreview(await tampered((z) => { z.remove('tree.json'); }))).rejects.toThrow(/missing entry tree.json/);
    await expect(readPreview(await tampered((z) => { z.file('density.f32', new Uint8Array(new Float32Array(64).fill(NaN).buffer)); }))).rejects.toThrow(/not a finite/);
    await expect(readPreview(await tampered(async (z) => {
      const m = JSON.parse(await z.file('preview.json')!.async('string'));
      m.cells = 100000;
      z.file('preview.json', JSON.stringify(m));
    }))).rejects.toThrow(/cells must be/);
    await expect(readPreview(path.join(dir, 'none.zip'))).rejects.toThrow(/no such file/);
    writeFileSync(path.join(dir, 'junk.zip'), 'not a zip');
    await expect(readPreview(path.join(dir, 'junk.zip'))).rejects.toThrow(/not a readable zip/);
  });
});
