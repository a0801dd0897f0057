/**
 * writeGridExports: the ic/ folder of a run — gridded fields as .npy, .raw, HDF5 and VTK image
 * data, optional equal-mass particles, and ic/manifest.json describing and checksumming all of it.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, index (i*ny + j)*nz + k,
 * i along x; cell-centred (B too); box [-L/2, L/2)^3; Cloud fields in cgs, written in the chosen
 * unit system (unit-system.ts). Every file goes to a temporary name and is renamed when complete;
 * existing files are refused without force, and all targets are checked before anything is written.
 */
import path from 'node:path';
import type { Cloud } from '../generate/cloud.js';
import { cellSize } from '../grid/grid3.js';
import type { ProgressSink } from '../progress.js';
import { silentProgress } from '../progress.js';
import { assertWritable, writeFileAtomic, openAtomicStream } from './atomic-file.js';
import { littleEndianBytes, npyHeader } from './npy.js';
import { gridFields, groupVectors, INTERNAL_ENERGY_GAMMA, floatArray, type ThermalField } from './grid-fields.js';
import { writeFieldStream, type WrittenFile } from './grid-stream.js';
import type { WorkerPool } from '../grid/pool.js';
import { writeVti } from './vti-writer.js';
import { writeHdf5, type H5Array } from './hdf5-writer.js';
import { sampleParticles, type ParticleMethod, type ParticleSet } from './particles.js';
import { describeUnitSystem, unitSystem, type QuantityKind, type UnitSystem, type UnitSystemName } from './unit-system.js';
import { AXIS_ORDER, CENTRING, mergeManifests, type IcFileRecord, type IcManifest } from './ic-manifest.js';

/** Grid export format. */
export type GridFormat = 'npy' | 'raw' | 'hdf5' | 'vti';
export const GRID_FORMATS: readonly GridFormat[] = ['npy', 'raw', 'hdf5', 'vti'];

/** Options of writeGridExports (mirrors the config's export section, lengths and masses in cgs). */
export interface GridExportOptions {
  formats: readonly GridFormat[];
  precision: 'float32' | 'float64';
  units: UnitSystemName;
  /** Code units (length cm, mass g); needed when units = 'code'. */
  codeUnits?: { length: number; mass: number };
  thermalField: ThermalField;
  particles?: { count: number; method: ParticleMethod; region?: 'box' | 'cloud'; neighbours?: number; resolvableFactor?: number; eta?: number } | null;
  force: boolean;
  /** A manifest already in icDir to merge into (its manifest.json is then replaced). */
  previous?: IcManifest | null;
  /** Called with each file name (relative to icDir) once it is written. */
  onWritten?: (name: string) => void;
  /** Mean molecular weight for the internal energy; default cloud.summary.mu. */
  mu?: number;
  /** Worker threads: float32 .npy/.raw files that hold a shared field as it is are written there, all at once (same bytes). */
  pool?: WorkerPool | null;
}

/** Provenance written into the manifest. */
export interface ExportMeta {
  toolVersion: string;
  seed: number;
  configText: string;
  configSha256: string;
  name: string;
}

/** File name of a grid field in a format. */
export function gridFileName(field: string, format: 'npy' | 'raw'): string {
  return `${field}.${format}`;
}
/** File name of the single-file formats. */
export const HDF5_FILE = 'cloud.h5';
export const VTI_FILE = 'cloud.vti';
/** Particle arrays: name, quantity, components. */
const PARTICLE_ARRAYS: ReadonlyArray<[string, QuantityKind, number]> = [
  ['position', 'length', 3], ['velocity', 'velocity', 3], ['mass', 'mass', 1],
  ['internal_energy', 'specific_energy', 1], ['smoothing_length', 'length', 1],
];

function particleData(p: ParticleSet, name: string): Float64Array {
  switch (name) {
    case 'position': return p.position;
    case 'velocity': return p.velocity;
    case 'mass': return new Float64Array(p.count).fill(p.mass);
    case 'internal_energy': return p.internalEnergy;
    default: return p.smoothingLength;
  }
}

/** Particle arrays converted to the unit system. */
function particleArrays(p: ParticleSet, u: UnitSystem): H5Array[] {
  return PARTICLE_ARRAYS.map(([name, kind, comps]) => {
    const src = particleData(p, name);
    const f = u.fromCgs[kind];
    const data = f === 1 ? src : src.map((v) => v * f);
    return {
      name, data, shape: comps > 1 ? [p.count, comps] : [p.count],
      attrs: { unit: u.labels[kind], to_cgs: u.toCgs[kind], quantity: kind, description: `particle ${name.replace('_', ' ')}` },
    };
  });
}

async function writeNpyArray(file: string, a: H5Array, precision: 'float32' | 'float64', force: boolean): Promise<{ sha256: string; bytes: number }> {
  const out = openAtomicStream(file, force);
  try {
    const h = npyHeader(precision, a.shape);
    await out.write(h);
    let bytes = h.length;
    const step = 1 << 20;
    const buf = floatArray(precision, Math.min(step, a.data.length));
    for (let s = 0; s < a.data.length; s += step) {
      const e = Math.min(a.data.length, s + step);
      const view = buf.subarray(0, e - s);
      view.set(a.data.subarray(s, e));
      await out.write(littleEndianBytes(view));
      bytes += view.byteLength;
    }
    return { sha256: await out.commit(), bytes };
  } catch (e) {
    out.abort();
    throw e;
  }
}

/** Writes ic/ exports of the cloud and ic/manifest.json; returns the manifest. Units per opts.units. */
export async function writeGridExports(cloudIn: Cloud, icDir: string, opts: GridExportOptions, meta: ExportMeta, progress: ProgressSink = silentProgress): Promise<IcManifest> {
  const cloud: Cloud = opts.mu !== undefined && opts.mu !== cloudIn.summary.mu ? { ...cloudIn, summary: { ...cloudIn.summary, mu: opts.mu } } : cloudIn;
  const u = unitSystem(opts.units, opts.codeUnits);
  const fields = gridFields(cloud, u, opts.thermalField);
  const g = cloud.grid;
  const formats = [...new Set(opts.formats)];
  const dtype = opts.precision;
  const manifestPath = path.join(icDir, 'manifest.json');

  // check every target before writing anything
  const targets: string[] = [];
  for (const fmt of formats) {
    if (fmt === 'npy' || fmt === 'raw') for (const f of fields) targets.push(gridFileName(f.name, fmt));
    if (fmt === 'hdf5') targets.push(HDF5_FILE);
    if (fmt === 'vti') targets.push(VTI_FILE);
  }
  if (opts.particles) for (const [name] of PARTICLE_ARRAYS) targets.push(`particle_${name}.npy`);
  for (const t of targets) assertWritable(path.join(icDir, t), opts.force);
  assertWritable(manifestPath, opts.force || !!opts.previous);

  const files: Record<string, IcFileRecord> = {};
  const record = (name: string, r: Omit<IcFileRecord, 'unit_system' | 'dtype'>): void => {
    files[name] = { ...r, dtype, unit_system: u.name } as IcFileRecord;
    opts.onWritten?.(name);
  };
  const shape: [number, number, number] = [g.nx, g.ny, g.nz];
  const headerBytes = npyHeader(dtype, shape).length;

  let particles: ParticleSet | null = null;
  let pArrays: H5Array[] | null = null;
  if (opts.particles) {
    const st = progress.stage(`sampling ${opts.particles.count} particles (${opts.particles.method})`, 1);
    particles = sampleParticles(cloud, opts.particles);
    pArrays = particleArrays(particles, u);
    st.update(1);
    st.stop();
  }

  for (const fmt of formats) {
    if (fmt === 'npy' || fmt === 'raw') {
      const st = progress.stage(`writing ${fmt} grids`, fields.length * g.nx);
      // files that are a shared field's bytes as they are go to the worker threads first, all at once
      const header = fmt === 'npy' ? npyHeader(dtype, shape) : new Uint8Array(0);
      let done = 0;
      const onWorker = fields.map((f) => (opts.pool && dtype === 'float32' && f.scale === 1 && f.source.buffer instanceof SharedArrayBuffer
        ? opts.pool.run<WrittenFile>('exportFieldFile', [path.join(icDir, gridFileName(f.name, fmt)), header, f.source, opts.force]).then((w) => { st.update(done += g.nx); return w; })
        : null));
      onWorker.forEach((p) => p?.catch(() => {})); // awaited below; a failure is reported there
      for (const [q, f] of fields.entries()) {
        const name = gridFileName(f.name, fmt);
        const base = done;
        const sub = { update: (d: number) => st.update(base + d), stop: () => {} };
        const w = await (onWorker[q] ?? writeFieldStream(path.join(icDir, name), f, g, dtype, fmt === 'npy', opts.force, sub));
        if (!onWorker[q]) done += g.nx;
        record(name, { format: fmt, contents: f.name, shape: [...shape], unit: f.unit, to_cgs: f.toCgs, data_offset_bytes: fmt === 'npy' ? headerBytes : 0, ...w });
      }
      st.stop();
    } else if (fmt === 'vti') {
      const st = progress.stage('writing VTK image data', g.nz * groupVectors(fields).length);
      const comment = `fragplan ${meta.toolVersion} initial conditions "${meta.name}", seed ${meta.seed}, units ${u.name}; cell data, see manifest.json`;
      const w = await writeVti(path.join(icDir, VTI_FILE), g, fields, dtype, u, comment, opts.force, st);
      record(VTI_FILE, { format: 'vti', contents: 'all grid fields (velocity and magnetic as 3-component vectors)', ...w });
      st.stop();
    } else if (fmt === 'hdf5') {
      const st = progress.stage('writing HDF5', fields.length * g.nx);
      const L = g.boxSize * u.fromCgs.length;
      const w = await writeHdf5(path.join(icDir, HDF5_FILE), {
        rootAttrs: {
          schema: 'fragplan.ic/1', name: meta.name, unit_system: u.name, units_json: JSON.stringify(describeUnitSystem(u)),
          tool_version: meta.toolVersion, seed: meta.seed, config_sha256: meta.configSha256,
          axis_order: AXIS_ORDER, centring: CENTRING, shape: [...shape],
          box_size: L, cell_size: cellSize(g) * u.fromCgs.length, origin: [-L / 2, -L / 2, -L / 2],
          length_unit: u.labels.length,
        },
        grid: g, fields, particles: pArrays,
      }, dtype, opts.force, st);
      record(HDF5_FILE, { format: 'hdf5', contents: `all grid fields under /grid${pArrays ? ', particles under /particles' : ''}`, ...w });
      st.stop();
    }
  }

  if (pArrays) {
    for (const a of pArrays) {
      const name = `particle_${a.name}.npy`;
      const w = await writeNpyArray(path.join(icDir, name), a, dtype, opts.force);
      record(name, { format: 'npy', contents: `particle_${a.name}`, shape: a.shape, unit: String(a.attrs.unit), to_cgs: Number(a.attrs.to_cgs), data_offset_bytes: npyHeader(dtype, a.shape).length, ...w });
    }
  }

  const dx = cellSize(g);
  const manifest: IcManifest = {
    schema: 'fragplan.ic/1',
    name: meta.name,
    tool_version: meta.toolVersion,
    seed: meta.seed,
    grid: {
      shape, axis_order: AXIS_ORDER, centring: CENTRING, endianness: 'little',
      box_size_cm: g.boxSize, cell_size_cm: dx, origin_cm: [-g.boxSize / 2, -g.boxSize / 2, -g.boxSize / 2],
    },
    unit_systems: { [u.name]: describeUnitSystem(u) },
    thermal: {
      field: opts.thermalField, mu: cloud.summary.mu, gamma: INTERNAL_ENERGY_GAMMA,
      formula: 'u = k_B T / ((gamma - 1) mu m_H) = (3/2) k_B T / (mu m_H) for gamma = 5/3 (ideal gas)',
    },
    fields: Object.fromEntries(fields.map((f) => [f.name, { quantity: f.kind, description: f.description }])),
    files,
    particles: particles ? particles.report : null,
    cloud_summary: cloud.summary,
    config_sha256: meta.configSha256,
    config_text: meta.configText,
    cautions: [
      'These are initial conditions only: fragplan does not evolve the cloud. Its forecasts are statistical previews, not simulations; check convergence in the real run.',
      ...(particles ? [particles.report.caution] : []),
    ],
  };
  const merged = mergeManifests(opts.previous ?? null, manifest);
  writeFileAtomic(manifestPath, JSON.stringify(merged, null, 2) + '\n', true);
  return merged;
}
