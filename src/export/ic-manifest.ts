/**
 * ic/manifest.json (schema "fragplan.ic/1"): everything needed to read the exported initial
 * conditions without guessing, and to verify and reproduce them.
 *
 * Grid conventions of every grid file: shape (nx, ny, nz), C order, index (i*ny + j)*nz + k,
 * i along x, k fastest; cell-centred (B cell-centred too); box [-L/2, L/2)^3; little-endian.
 * Each file record carries its own unit system and dtype, so files written by later
 * `fragplan export` calls in other units can sit beside the first ones.
 */
import type { CloudSummary } from '../generate/cloud.js';
import type { ParticleReport } from './particles.js';

/** One written file. */
export interface IcFileRecord {
  format: 'npy' | 'raw' | 'hdf5' | 'vti';
  /** What it holds: a grid field name, "particle_<name>", or "all fields" for hdf5/vti. */
  contents: string;
  dtype: 'float32' | 'float64';
  /** Array shape for npy/raw files (C order). */
  shape?: number[];
  unit_system: string;
  /** Unit of the values (npy/raw) and the factor to cgs. */
  unit?: string;
  to_cgs?: number;
  /** Bytes before the data (npy header; 0 for raw). */
  data_offset_bytes?: number;
  bytes: number;
  sha256: string;
}

/** ic/manifest.json */
export interface IcManifest {
  schema: 'fragplan.ic/1';
  name: string;
  tool_version: string;
  seed: number;
  grid: {
    shape: [number, number, number];
    axis_order: string;
    centring: string;
    endianness: 'little';
    box_size_cm: number;
    cell_size_cm: number;
    /** Lower corner of the box (the box spans [-L/2, L/2) on each axis), cm. */
    origin_cm: [number, number, number];
  };
  /** Unit systems used by the files, by name, with labels and conversion factors. */
  unit_systems: Record<string, Record<string, unknown>>;
  thermal: { field: 'temperature' | 'internal_energy'; mu: number; gamma: number; formula: string };
  fields: Record<string, { quantity: string; description: string }>;
  files: Record<string, IcFileRecord>;
  particles: ParticleReport | null;
  /** The generator's description of the cloud, cgs (lets `fragplan export` rebuild a Cloud from the grids). */
  cloud_summary: CloudSummary;
  config_sha256: string;
  config_text: string;
  cautions: string[];
}

/** Axis-order text used in manifests and file attributes. */
export const AXIS_ORDER = 'C order, shape (nx, ny, nz), flat index (i*ny + j)*nz + k, i along x, k along z (fastest)';
/** Centring text used in manifests and file attributes. */
export const CENTRING = 'cell-centred; B cell-centred too; box [-L/2, L/2) on each axis, cell (i, j, k) centred at -L/2 + (i + 1/2) dx';

/** Merges a new manifest over an old one: new file records replace those of the same name, others stay. */
export function mergeManifests(old: IcManifest | null, next: IcManifest): IcManifest {
  if (!old) return next;
  return {
    ...next,
    unit_systems: { ...old.unit_systems, ...next.unit_systems },
    fields: { ...old.fields, ...next.fields },
    files: Object.fromEntries(Object.entries({ ...old.files, ...next.files }).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))),
    particles: next.particles ?? old.particles,
  };
}
