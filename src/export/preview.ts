/**
 * preview.zip: writer and validating reader of the bundle the viewer loads, laid out exactly as
 * src/export/preview-layout.ts says (schema "fragplan.preview/1").
 *
 * Grid conventions: the full grid is (n, n, n), C order, index (i*n + j)*n + k, i along x,
 * cell-centred, box [-L/2, L/2)^3, cgs. The preview has c = n / b cells per side (b the block
 * factor; c the largest divisor of n not above the requested preview cells) and the same order.
 * Bytes are deterministic: entries in a fixed order, every entry dated 1980-01-01T00:00:00Z,
 * DEFLATE at a fixed level.
 */
import type JSZip from 'jszip';
import { zipArchive, type ZipEntry } from './zip-writer.js';
import { readFileSync, statSync } from 'node:fs';
import type { Cloud } from '../generate/cloud.js';
import { PC } from '../physics/constants.js';
import { InputError } from '../input-error.js';
import { writeFileAtomic } from './atomic-file.js';
import { littleEndianBytes } from './npy.js';
import type { PreviewManifest, PreviewField } from './preview-layout.js';

/** Fixed date of every zip entry (the DOS epoch), for reproducible bytes. */
export const ZIP_DATE = new Date(Date.UTC(1980, 0, 1, 0, 0, 0));
/** Most particles stored in a preview. */
export const PREVIEW_MAX_PARTICLES = 100_000;

/** What writePreview needs. particles: optional positions as x, y, z triples in cm (subsampled here). */
export interface PreviewParts {
  cloud: Cloud;
  jeansNumber: Float32Array;
  labels: Int32Array;
  summary: object;
  tree: object;
  fragmentsCsv: string;
  plots: object;
  particles?: Float32Array | Float64Array | null;
  previewCells: number;
  toolVersion: string;
  /** previewBlocks of the cloud's density and jeansNumber at previewSize(n, previewCells), when made already (e.g. on a worker). */
  blocks?: PreviewBlocks;
  /** The tree as JSON text (JSON.stringify(tree, null, 2) + newline), when written already. */
  treeText?: string;
}

/** The largest divisor of n that is at most want (at least 1). */
export function previewSize(n: number, want: number): number {
  let c = Math.max(1, Math.min(n, Math.floor(want)));
  while (n % c !== 0) c--;
  return c;
}

/** Block reductions that need no labels: mean density (g/cm^3), maximum Jeans number, and the flat index of each block's densest cell (first in index order; -1 none). */
export interface PreviewBlocks {
  readonly cells: number;
  readonly density: Float32Array;
  readonly jeans: Float32Array;
  readonly densest: Float64Array;
}

/** PreviewBlocks of an n^3 grid on c^3 blocks (c divides n): density in g/cm^3, Jeans numbers dimensionless. */
export function previewBlocks(n: number, c: number, density: Float32Array, jeans: Float32Array): PreviewBlocks {
  const b = n / c;
  const out: PreviewBlocks = { cells: c, density: new Float32Array(c * c * c), jeans: new Float32Array(c * c * c), densest: new Float64Array(c * c * c) };
  const inv = 1 / (b * b * b);
  for (let bi = 0; bi < c; bi++) for (let bj = 0; bj < c; bj++) previewRow(n, c, b, bi, bj, density, jeans, inv, out);
  return out;
}

/**
 * Blocks (bi, bj, 0..c-1) of previewBlocks: each block's cells visited in cell order (i, then j, then
 * k), as a plane-by-plane sweep would, with its sum in a Float64 register.
 */
function previewRow(n: number, c: number, b: number, bi: number, bj: number, density: Float32Array, jeans: Float32Array, inv: number, out: PreviewBlocks): void {
  for (let bk = 0; bk < c; bk++) {
    let sum = 0, jmax = -Infinity, peak = -Infinity, at = -1;
    for (let di = 0; di < b; di++) {
      for (let dj = 0; dj < b; dj++) {
        const row = ((bi * b + di) * n + bj * b + dj) * n + bk * b;
        for (let dk = 0; dk < b; dk++) {
          const v = density[row + dk]!;
          sum += v;
          const jn = jeans[row + dk]!;
          if (jn > jmax) jmax = jn;
          if (v > peak) { peak = v; at = row + dk; }
        }
      }
    }
    const q = (bi * c + bj) * c + bk;
    out.density[q] = sum * inv;
    out.jeans[q] = jmax;
    out.densest[q] = at;
  }
}

/** Label (tree node id, -1 none) of each block's densest cell. */
export function blockLabels(densest: Float64Array, labels: Int32Array): Int32Array {
  const l = new Int32Array(densest.length);
  for (let q = 0; q < densest.length; q++) l[q] = densest[q]! >= 0 ? labels[densest[q]!]! : -1;
  return l;
}

function range(a: Float32Array | Int32Array): { min: number; max: number } {
  let min = Infinity, max = -Infinity;
  for (let q = 0; q < a.length; q++) { const v = a[q]!; if (v < min) min = v; if (v > max) max = v; }
  return a.length ? { min, max } : { min: 0, max: 0 };
}

/** Writes preview.zip (temp name then rename; refuses to replace without force); returns its sha256 (hex). */
export async function writePreview(zipPath: string, parts: PreviewParts, force: boolean): Promise<string> {
  const g = parts.cloud.grid;
  if (g.nx !== g.ny || g.nx !== g.nz) throw new RangeError(`preview needs a cubic grid, got ${g.nx}x${g.ny}x${g.nz}`);
  const n = g.nx;
  const N = n * n * n;
  if (parts.jeansNumber.length !== N || parts.labels.length !== N) throw new RangeError(`jeansNumber and labels must hold ${N} cells`);
  const c = previewSize(n, parts.previewCells);
  const blocks = parts.blocks ?? previewBlocks(n, c, parts.cloud.density, parts.jeansNumber);
  if (blocks.cells !== c) throw new RangeError(`preview blocks of ${blocks.cells} cells per side given, ${c} needed`);
  const ds = { density: blocks.density, jeans: blocks.jeans, labels: blockLabels(blocks.densest, parts.labels) };
  const field = (file: string, dtype: 'float32' | 'int32', unit: string, a: Float32Array | Int32Array): PreviewField => ({ file, dtype, unit, ...range(a) });
  let particles: Float32Array | null = null;
  if (parts.particles && parts.particles.length >= 3) {
    const total = Math.floor(parts.particles.length / 3);
    const stride = Math.ceil(total / PREVIEW_MAX_PARTICLES);
    const count = Math.ceil(total / stride);
    particles = new Float32Array(count * 3);
    for (let p = 0; p < count; p++) for (let a = 0; a < 3; a++) particles[3 * p + a] = parts.particles[3 * p * stride + a]! / PC.value;
  }
  const manifest: PreviewManifest = {
    schema: 'fragplan.preview/1',
    cells: c,
    source_cells: n,
    box_size_pc: g.boxSize / PC.value,
    axis_order: 'C order (i*n + j)*n + k, i along x',
    fields: {
      density: field('density.f32', 'float32', 'g cm^-3', ds.density),
      jeans: field('jeans.f32', 'float32', 'dimensionless (dx / lambda_J, block maximum)', ds.jeans),
      labels: field('labels.i32', 'int32', 'tree node id (-1 none)', ds.labels),
    },
    particles: particles ? { file: 'particles.f32', count: particles.length / 3, unit: 'pc' } : null,
    tool_version: parts.toolVersion,
    seed: parts.cloud.seed,
  };
  const entries: ZipEntry[] = [
    { name: 'preview.json', data: JSON.stringify(manifest, null, 2) + '\n' },
    { name: 'density.f32', data: littleEndianBytes(ds.density) },
    { name: 'jeans.f32', data: littleEndianBytes(ds.jeans) },
    { name: 'labels.i32', data: littleEndianBytes(ds.labels) },
    ...(particles ? [{ name: 'particles.f32', data: littleEndianBytes(particles) }] : []),
    { name: 'summary.json', data: JSON.stringify(parts.summary, null, 2) + '\n' },
    { name: 'tree.json', data: parts.treeText ?? JSON.stringify(parts.tree, null, 2) + '\n' },
    { name: 'fragments.csv', data: parts.fragmentsCsv },
    { name: 'plots.json', data: JSON.stringify(parts.plots) + '\n' },
  ];
  const bytes = await zipArchive(entries, ZIP_DATE, 6);
  return writeFileAtomic(zipPath, bytes, force);
}

/** A validated preview bundle. */
export interface PreviewBundle {
  manifest: PreviewManifest;
  density: Float32Array;
  jeans: Float32Array;
  labels: Int32Array;
  particles: Float32Array | null;
  summary: unknown;
  tree: unknown;
  fragmentsCsv: string;
  plots: unknown;
}

const JSON_ENTRIES = ['preview.json', 'summary.json', 'tree.json', 'plots.json'] as const;
const ALLOWED = new Set<string>([...JSON_ENTRIES, 'fragments.csv', 'density.f32', 'jeans.f32', 'labels.i32', 'particles.f32']);
/** Largest preview.zip read, bytes; largest text entry, bytes; largest preview side, cells. */
export const PREVIEW_LIMITS = { zipBytes: 1 << 30, textBytes: 64 << 20, cells: 512 } as const;

function declaredSize(entry: JSZip.JSZipObject): number | null {
  const d = (entry as unknown as { _data?: { uncompressedSize?: number } })._data;
  return typeof d?.uncompressedSize === 'number' ? d.uncompressedSize : null;
}

/** Reads and validates preview.zip (entry names, sizes, schema, finite values); InputError naming the file. */
export async function readPreview(zipPath: string): Promise<PreviewBundle> {
  const bad = (msg: string): InputError => new InputError(`${zipPath}: ${msg}`);
  let size: number;
  try { size = statSync(zipPath).size; } catch { throw bad('no such file'); }
  if (size > PREVIEW_LIMITS.zipBytes) throw bad(`${size} bytes is larger than the ${PREVIEW_LIMITS.zipBytes}-byte limit`);
  let zip: JSZip;
  // loaded here only: writing a plan does not need the zip reader
  const { default: Zip } = await import('jszip');
  try { zip = await Zip.loadAsync(readFileSync(zipPath)); } catch { throw bad('not a readable zip file'); }
  const entries: Record<string, JSZip.JSZipObject> = {};
  for (const [name, entry] of Object.entries(zip.files)) {
    if (entry.dir || name.includes('/') || name.includes('\\') || name.includes('..') || name.includes('\0') || !ALLOWED.has(name)) {
      throw bad(`unexpected entry "${name}" (a preview holds only ${[...ALLOWED].join(', ')} at its top level)`);
    }
    entries[name] = entry;
  }
  for (const need of ['preview.json', 'density.f32', 'jeans.f32', 'labels.i32', 'summary.json', 'tree.json', 'fragments.csv', 'plots.json']) {
    if (!entries[need]) throw bad(`missing entry ${need}`);
  }
  const text = async (name: string): Promise<string> => {
    const s = declaredSize(entries[name]!);
    if (s === null || s > PREVIEW_LIMITS.textBytes) throw bad(`entry ${name} is larger than ${PREVIEW_LIMITS.textBytes} bytes`);
    return entries[name]!.async('string');
  };
  const json = async (name: string): Promise<unknown> => {
    try { return JSON.parse(await text(name)); } catch (e) { if (e instanceof InputError) throw e; throw bad(`entry ${name} is not valid JSON`); }
  };
  const manifest = (await json('preview.json')) as PreviewManifest;
  const c = manifest?.cells;
  if (manifest?.schema !== 'fragplan.preview/1') throw bad('preview.json: expected schema "fragplan.preview/1"');
  if (!Number.isInteger(c) || c < 1 || c > PREVIEW_LIMITS.cells) throw bad(`preview.json: cells must be an integer from 1 to ${PREVIEW_LIMITS.cells}, got ${String(c)}`);
  if (!(manifest.box_size_pc > 0)) throw bad('preview.json: box_size_pc must be positive');
  const binary = async (name: string, bytes: number): Promise<ArrayBuffer> => {
    const s = declaredSize(entries[name]!);
    if (s !== bytes) throw bad(`entry ${name} holds ${String(s)} bytes, expected ${bytes}`);
    const u = await entries[name]!.async('uint8array');
    if (u.length !== bytes) throw bad(`entry ${name} decompressed to ${u.length} bytes, expected ${bytes}`);
    return u.slice().buffer;
  };
  const cells = c * c * c;
  const density = new Float32Array(await binary('density.f32', cells * 4));
  const jeans = new Float32Array(await binary('jeans.f32', cells * 4));
  const labels = new Int32Array(await binary('labels.i32', cells * 4));
  for (let q = 0; q < cells; q++) {
    if (!Number.isFinite(density[q]!) || density[q]! < 0) throw bad(`density.f32: value ${density[q]} at cell ${q} is not a finite non-negative density`);
    if (Number.isNaN(jeans[q]!)) throw bad(`jeans.f32: NaN at cell ${q}`);
  }
  let particles: Float32Array | null = null;
  if (manifest.particles) {
    const count = manifest.particles.count;
    if (!Number.isInteger(count) || count < 0 || count > PREVIEW_MAX_PARTICLES) throw bad(`preview.json: particles.count must be 0 to ${PREVIEW_MAX_PARTICLES}`);
    if (!entries['particles.f32']) throw bad('missing entry particles.f32');
    particles = new Float32Array(await binary('particles.f32', count * 12));
  }
  return {
    manifest, density, jeans, labels, particles,
    summary: await json('summary.json'), tree: await json('tree.json'),
    fragmentsCsv: await text('fragments.csv'), plots: await json('plots.json'),
  };
}
