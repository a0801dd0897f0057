/**
 * Reading a run's ic/ folder back: the manifest (validated), and the full-resolution Cloud rebuilt
 * from its .npy (or .raw) grids, converted back to cgs Float32 with the manifest's factors.
 *
 * Grid conventions: shape (nx, ny, nz), C order, index (i*ny + j)*nz + k, i along x, cell-centred,
 * box [-L/2, L/2)^3, little-endian. Every file read is checked against the manifest: sha256, size,
 * dtype, shape, and finite values.
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import type { Cloud } from '../generate/cloud.js';
import type { Grid3 } from '../grid/grid3.js';
import { InputError } from '../input-error.js';
import { decodeNpy } from './npy.js';
import { hashFile } from './hdf5-writer.js';
import { internalEnergyPerKelvin } from './grid-fields.js';
import type { IcFileRecord, IcManifest } from './ic-manifest.js';

/** Reads and checks ic/manifest.json of a run folder; InputError naming the file. */
export function readIcManifest(runDir: string): { manifest: IcManifest; manifestFile: string; icDir: string } {
  if (!existsSync(runDir) || !statSync(runDir).isDirectory()) throw new InputError(`${runDir}: not a folder (expected a plan run folder)`);
  const icDir = path.join(runDir, 'ic');
  const manifestFile = path.join(icDir, 'manifest.json');
  if (!existsSync(manifestFile)) throw new InputError(`${manifestFile}: not found (expected a plan run folder with ic/manifest.json)`);
  let manifest: IcManifest;
  try {
    manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as IcManifest;
  } catch {
    throw new InputError(`${manifestFile}: not valid JSON`);
  }
  if (manifest?.schema !== 'fragplan.ic/1') throw new InputError(`${manifestFile}: expected schema "fragplan.ic/1"`);
  const s = manifest.grid?.shape;
  if (!Array.isArray(s) || s.length !== 3 || s.some((v) => !Number.isInteger(v) || v < 1)) throw new InputError(`${manifestFile}: grid.shape must be three positive integers`);
  if (!(manifest.grid.box_size_cm > 0)) throw new InputError(`${manifestFile}: grid.box_size_cm must be positive`);
  if (typeof manifest.files !== 'object' || manifest.files === null) throw new InputError(`${manifestFile}: files must be an object`);
  if (typeof manifest.cloud_summary !== 'object' || manifest.cloud_summary === null) throw new InputError(`${manifestFile}: cloud_summary missing`);
  return { manifest, manifestFile, icDir };
}

/** The file record holding a grid field, preferring .npy over .raw; null when absent. */
export function gridFileFor(manifest: IcManifest, field: string): [string, IcFileRecord] | null {
  const all = Object.entries(manifest.files ?? {}).filter(([, r]) => r.contents === field && (r.format === 'npy' || r.format === 'raw'));
  return all.find(([, r]) => r.format === 'npy') ?? all[0] ?? null;
}

/** What `fragplan survey <run dir>` needs from a run: box (cm), temperature (K), mu, density factor to cgs, config. */
export function runDescription(manifest: Record<string, unknown>, manifestFile: string): { boxSize: number; temperature: number; mu: number; densityToCgs: number; configText: string | null } {
  const m = manifest as unknown as IcManifest;
  if (m.schema !== 'fragplan.ic/1' || !(m.grid?.box_size_cm > 0)) throw new InputError(`${manifestFile}: not a fragplan ic manifest (schema "fragplan.ic/1" with grid.box_size_cm)`);
  const f = gridFileFor(m, 'density');
  if (!f) throw new InputError(`${manifestFile}: lists no density.npy or density.raw`);
  return {
    boxSize: m.grid.box_size_cm,
    temperature: m.cloud_summary?.temperature ?? 10,
    mu: m.cloud_summary?.mu ?? m.thermal?.mu,
    densityToCgs: f[1].to_cgs ?? 1,
    configText: typeof m.config_text === 'string' ? m.config_text : null,
  };
}

/** Path of the run's density grid (.npy preferred, else .raw, whose shape and dtype are in the manifest). */
export function runDensityFile(manifest: Record<string, unknown>, icDir: string, manifestFile: string): string {
  const f = gridFileFor(manifest as unknown as IcManifest, 'density');
  if (!f) throw new InputError(`${manifestFile}: lists no density.npy or density.raw`);
  return path.join(icDir, f[0]);
}

/** Reads one listed grid file, checks it, and returns it as cgs Float32 (values * to_cgs * extra). */
async function readGridFile(icDir: string, name: string, rec: IcFileRecord, shape: readonly number[], extra = 1): Promise<Float32Array> {
  const file = path.join(icDir, name);
  if (!existsSync(file)) throw new InputError(`${file}: listed in manifest.json but missing`);
  const { sha256, bytes } = await hashFile(file);
  if (bytes !== rec.bytes || sha256 !== rec.sha256) throw new InputError(`${file}: size or sha256 differs from manifest.json (file changed since export)`);
  const raw = readFileSync(file);
  let data: Float32Array | Float64Array;
  if (rec.format === 'npy') {
    const a = decodeNpy(raw, file);
    if (a.dtype !== rec.dtype || a.shape.join(',') !== shape.join(',')) throw new InputError(`${file}: dtype/shape ${a.dtype} (${a.shape.join(', ')}) differ from manifest.json`);
    data = a.data as Float32Array | Float64Array;
  } else {
    const b = rec.dtype === 'float64' ? 8 : 4;
    const n = shape.reduce((x, y) => x * y, 1);
    if (raw.length !== n * b) throw new InputError(`${file}: ${raw.length} bytes, expected ${n * b} for shape (${shape.join(', ')}) ${rec.dtype}`);
    const copy = raw.buffer.slice(raw.byteOffset, raw.byteOffset + raw.length);
    data = rec.dtype === 'float64' ? new Float64Array(copy) : new Float32Array(copy);
  }
  const f = (rec.to_cgs ?? 1) * extra;
  const out = new Float32Array(data.length);
  for (let q = 0; q < data.length; q++) {
    const v = data[q]!;
    if (!Number.isFinite(v)) throw new InputError(`${file}: non-finite value at index ${q}`);
    out[q] = f === 1 ? v : v * f;
  }
  return out;
}

/** Rebuilds the full-resolution Cloud (cgs Float32) from a run's ic/ grids; inside = 1 everywhere (not stored). */
export async function readIcCloud(manifest: IcManifest, icDir: string, manifestFile: string): Promise<Cloud> {
  const shape = manifest.grid.shape;
  const need = (field: string): [string, IcFileRecord] => {
    const f = gridFileFor(manifest, field);
    if (!f) throw new InputError(`${manifestFile}: no ${field}.npy or ${field}.raw listed; rerun plan with export.formats including npy`);
    return f;
  };
  const read = async (field: string, extra = 1): Promise<Float32Array> => { const [n, r] = need(field); return readGridFile(icDir, n, r, shape, extra); };
  const density = await read('density');
  const velocity: [Float32Array, Float32Array, Float32Array] = [await read('velocity_x'), await read('velocity_y'), await read('velocity_z')];
  const mu = manifest.cloud_summary.mu;
  const temperature = gridFileFor(manifest, 'temperature')
    ? await read('temperature')
    : await read('internal_energy', 1 / internalEnergyPerKelvin(mu));
  const magnetic: [Float32Array, Float32Array, Float32Array] | null = gridFileFor(manifest, 'magnetic_x')
    ? [await read('magnetic_x'), await read('magnetic_y'), await read('magnetic_z')]
    : null;
  const grid: Grid3 = { nx: shape[0], ny: shape[1], nz: shape[2], boxSize: manifest.grid.box_size_cm };
  return { grid, density, velocity, temperature, magnetic, inside: new Uint8Array(density.length).fill(1), summary: manifest.cloud_summary, seed: manifest.seed };
}
