/**
 * Reading a preview bundle (src/export/preview-layout.ts) into typed arrays, plus the pure
 * helpers the viewer needs: tree subtrees, cell masks, candidate positions. No DOM, no three.js.
 * Fields: shape (n, n, n), C order, index (i*n + j)*n + k, i along x, cell-centred, box
 * [-L/2, L/2)^3 with L = box_size_pc; density g/cm^3, Jeans number dimensionless, labels node ids.
 */
import type { PreviewManifest } from '../../src/export/preview-layout.js';
import type { PlotData, TreePlotNode } from '../../src/report/plot-data.js';
import type { Summary } from '../../src/report/summary-types.js';

/** A fragment candidate to mark in 3D: position in pc. */
export interface Candidate {
  id: number;
  mass_msun: number;
  state: TreePlotNode['state'];
  position: [number, number, number];
}

/** Everything the viewer shows, decoded. */
export interface PreviewData {
  manifest: PreviewManifest;
  n: number;
  boxPc: number;
  density: Float32Array;
  jeans: Float32Array;
  labels: Int32Array;
  particles: Float32Array | null;
  summary: Summary | null;
  plots: PlotData | null;
  tree: TreePlotNode[];
  candidates: Candidate[];
}

/** Raw zip entries by name: binary entries as bytes, JSON/CSV as text. */
export interface PreviewEntries {
  text(name: string): string | null;
  bytes(name: string): Uint8Array | null;
}

function typed<T extends Float32Array | Int32Array>(b: Uint8Array, ctor: { new (buf: ArrayBuffer): T }, count: number, name: string): T {
  if (b.byteLength !== count * 4) throw new Error(`${name}: ${b.byteLength} bytes, expected ${count * 4} (${count} values of 4 bytes)`);
  const copy = new Uint8Array(b.byteLength);
  copy.set(b);
  return new ctor(copy.buffer);
}

/** Splits CSV text into a header and rows (commas, optional double quotes; no embedded newlines). */
export function parseCsv(text: string): { header: string[]; rows: string[][] } {
  const lines = text.split(/\r?\n/).filter((l) => l.trim() !== '' && !l.startsWith('#'));
  const split = (l: string): string[] => {
    const out: string[] = [];
    let cur = '';
    let q = false;
    for (let i = 0; i < l.length; i++) {
      const c = l[i];
      if (q) {
        if (c === '"' && l[i + 1] === '"') {
          cur += '"';
          i++;
        } else if (c === '"') q = false;
        else cur += c;
      } else if (c === '"') q = true;
      else if (c === ',') {
        out.push(cur.trim());
        cur = '';
      } else cur += c;
    }
    out.push(cur.trim());
    return out;
  };
  if (lines.length === 0) return { header: [], rows: [] };
  return { header: split(lines[0]).map((h) => h.toLowerCase()), rows: lines.slice(1).map(split) };
}

/** The ids of node `id` and all its descendants. */
export function subtreeIds(tree: readonly TreePlotNode[], id: number): Set<number> {
  const kids = new Map<number, number[]>();
  for (const n of tree) {
    const list = kids.get(n.parent) ?? [];
    list.push(n.id);
    kids.set(n.parent, list);
  }
  const out = new Set<number>();
  const stack = [id];
  while (stack.length) {
    const x = stack.pop() as number;
    if (out.has(x)) continue;
    out.add(x);
    for (const c of kids.get(x) ?? []) stack.push(c);
  }
  return out;
}

/** Writes 255 into `out` where the cell's label is in `ids`, 0 elsewhere; returns the number of cells set. */
export function fillMask(labels: Int32Array, ids: ReadonlySet<number>, out: Uint8Array): number {
  let count = 0;
  for (let c = 0; c < labels.length; c++) {
    const hit = labels[c] >= 0 && ids.has(labels[c]);
    out[c] = hit ? 255 : 0;
    if (hit) count++;
  }
  return count;
}

/** Density-weighted centre (pc) of the cells labelled with any of `ids`, or null if none. */
export function labelCentroid(labels: Int32Array, density: Float32Array, n: number, boxPc: number, ids: ReadonlySet<number>): [number, number, number] | null {
  let w = 0;
  let sx = 0;
  let sy = 0;
  let sz = 0;
  const dx = boxPc / n;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      for (let k = 0; k < n; k++) {
        const c = (i * n + j) * n + k;
        if (labels[c] < 0 || !ids.has(labels[c])) continue;
        const m = density[c] > 0 ? density[c] : 0;
        w += m;
        sx += m * (-boxPc / 2 + (i + 0.5) * dx);
        sy += m * (-boxPc / 2 + (j + 0.5) * dx);
        sz += m * (-boxPc / 2 + (k + 0.5) * dx);
      }
    }
  }
  return w > 0 ? [sx / w, sy / w, sz / w] : null;
}

const COLUMN_NAMES = {
  id: ['id', 'node', 'node_id'],
  x: ['x_pc', 'centre_x_pc', 'center_x_pc', 'cx_pc'],
  y: ['y_pc', 'centre_y_pc', 'center_y_pc', 'cy_pc'],
  z: ['z_pc', 'centre_z_pc', 'center_z_pc', 'cz_pc'],
};

/** Candidate positions from fragments.csv when it names id and x/y/z (pc) columns; id -> position. */
export function positionsFromCsv(text: string | null): Map<number, [number, number, number]> {
  const out = new Map<number, [number, number, number]>();
  if (!text) return out;
  const { header, rows } = parseCsv(text);
  const col = (names: string[]) => header.findIndex((h) => names.includes(h));
  const [ci, cx, cy, cz] = [col(COLUMN_NAMES.id), col(COLUMN_NAMES.x), col(COLUMN_NAMES.y), col(COLUMN_NAMES.z)];
  if (ci < 0 || cx < 0 || cy < 0 || cz < 0) return out;
  for (const r of rows) {
    const v = [r[ci], r[cx], r[cy], r[cz]].map(Number);
    if (v.every(Number.isFinite)) out.set(v[0], [v[1], v[2], v[3]]);
  }
  return out;
}

/** The candidates to mark: tree nodes flagged candidate, placed by fragments.csv or else by the labels' density-weighted centre. */
export function findCandidates(tree: readonly TreePlotNode[], csv: string | null, labels: Int32Array, density: Float32Array, n: number, boxPc: number): Candidate[] {
  const fromCsv = positionsFromCsv(csv);
  const out: Candidate[] = [];
  for (const node of tree) {
    if (!node.candidate) continue;
    const p = fromCsv.get(node.id) ?? labelCentroid(labels, density, n, boxPc, subtreeIds(tree, node.id));
    if (p) out.push({ id: node.id, mass_msun: node.mass_msun, state: node.state, position: p });
  }
  return out;
}

/** Tree nodes from plots.json, or from tree.json ({nodes: [...]} or an array) when plots.json has none. */
function treeOf(plots: PlotData | null, treeJson: unknown): TreePlotNode[] {
  if (plots && Array.isArray(plots.tree) && plots.tree.length > 0) return plots.tree;
  const list = Array.isArray(treeJson) ? treeJson : (treeJson as { nodes?: unknown })?.nodes;
  if (!Array.isArray(list)) return plots?.tree ?? [];
  return list.map((x: Record<string, unknown>) => ({
    id: Number(x.id),
    parent: Number(x.parent ?? -1),
    mass_msun: Number(x.mass_msun ?? 0),
    merge_density_gcc: Number(x.merge_density_gcc ?? 0),
    peak_density_gcc: Number(x.peak_density_gcc ?? 0),
    state: (x.state as TreePlotNode['state']) ?? 'stable',
    candidate: Boolean(x.candidate),
  }));
}

function json(entries: PreviewEntries, name: string, required: boolean): unknown {
  const t = entries.text(name);
  if (t === null) {
    if (required) throw new Error(`preview.zip has no ${name}`);
    return null;
  }
  try {
    return JSON.parse(t);
  } catch {
    throw new Error(`${name} in preview.zip is not valid JSON`);
  }
}

/** Decodes and checks a preview bundle; throws an Error naming the entry at fault. */
export function decodePreview(entries: PreviewEntries): PreviewData {
  const manifest = json(entries, 'preview.json', true) as PreviewManifest;
  if (manifest?.schema !== 'fragplan.preview/1') throw new Error(`preview.json: schema ${String(manifest?.schema)}, expected fragplan.preview/1`);
  const n = manifest.cells;
  if (!Number.isInteger(n) || n < 1 || n > 512) throw new Error(`preview.json: cells = ${n}, expected an integer 1..512`);
  const boxPc = manifest.box_size_pc;
  if (!(boxPc > 0)) throw new Error(`preview.json: box_size_pc = ${boxPc}, expected > 0`);
  const count = n * n * n;
  const need = (f: { file: string }) => {
    const b = entries.bytes(f.file);
    if (!b) throw new Error(`preview.zip has no ${f.file}`);
    return b;
  };
  const density = typed(need(manifest.fields.density), Float32Array, count, manifest.fields.density.file);
  const jeans = typed(need(manifest.fields.jeans), Float32Array, count, manifest.fields.jeans.file);
  const labels = typed(need(manifest.fields.labels), Int32Array, count, manifest.fields.labels.file);
  let particles: Float32Array | null = null;
  if (manifest.particles) {
    particles = typed(need(manifest.particles), Float32Array, 3 * manifest.particles.count, manifest.particles.file);
  }
  const summary = json(entries, 'summary.json', false) as Summary | null;
  const plots = json(entries, 'plots.json', false) as PlotData | null;
  const tree = treeOf(plots, json(entries, 'tree.json', false));
  const candidates = findCandidates(tree, entries.text('fragments.csv'), labels, density, n, boxPc);
  return { manifest, n, boxPc, density, jeans, labels, particles, summary, plots, tree, candidates };
}

/** Maps density to bytes on a log scale: 0 at `lo` (and for rho <= 0), 255 at `hi` (g/cm^3). */
export function logDensityBytes(density: Float32Array, lo: number, hi: number, out = new Uint8Array(density.length)): Uint8Array {
  const a = Math.log10(lo);
  const span = Math.log10(hi) - a || 1;
  for (let c = 0; c < density.length; c++) {
    const d = density[c];
    if (!(d > 0)) {
      out[c] = 0;
      continue;
    }
    const t = (Math.log10(d) - a) / span;
    out[c] = t <= 0 ? 0 : t >= 1 ? 255 : Math.round(t * 255);
  }
  return out;
}

/** Smallest positive and largest value of an array (null when none is positive). */
export function positiveRange(a: Float32Array): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (let c = 0; c < a.length; c++) {
    const v = a[c];
    if (v > 0 && v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : null;
}
