/**
 * HDF5 export through h5wasm (the HDF5 C library compiled to WebAssembly; its Node build reads
 * and writes the host file system directly).
 *
 * Layout of our own design (schema "fragplan.ic/1"):
 *   /                  attributes: schema, unit_system, units_json (the unit table), tool_version,
 *                      seed, config_sha256, axis_order, centring, box_size, cell_size, origin
 *                      (file length unit), shape
 *   /grid/<field>      (nx, ny, nz) float32 or float64, C order, index (i*ny + j)*nz + k, i along x,
 *                      cell-centred, box [-L/2, L/2)^3; attributes unit, to_cgs, quantity, description
 *                      fields: density, velocity_x|y|z, temperature or internal_energy, magnetic_x|y|z
 *   /particles/<name>  when particles were sampled: position (N, 3), velocity (N, 3), mass (N,),
 *                      internal_energy (N,), smoothing_length (N,); same attributes
 * Grid datasets are chunked by x-plane (1, ny, nz) and written plane by plane, so no second full
 * copy of a field is made. HDF5 stamps object headers with the wall-clock time; to keep the bytes
 * reproducible the clock h5wasm sees is pinned to 1980-01-01T00:00:00Z while the file is written.
 */
import { renameSync, rmSync, mkdirSync, createReadStream } from 'node:fs';
import { createHash } from 'node:crypto';
import path from 'node:path';
import type { Grid3 } from '../grid/grid3.js';
import { assertWritable, tempName } from './atomic-file.js';
import { fillPlane, floatArray, type GridField } from './grid-fields.js';
import type { WrittenFile } from './grid-stream.js';
import type { ProgressStage } from '../progress.js';

/** Fixed clock for HDF5 object time stamps, ms since 1970 (1980-01-01, the zip epoch too). */
const FIXED_CLOCK_MS = Date.UTC(1980, 0, 1);

/** A 1D or 2D particle array to store, in file units. */
export interface H5Array {
  name: string;
  data: Float64Array;
  shape: number[];
  attrs: Record<string, string | number>;
}

/** Everything an HDF5 export holds. */
export interface H5Content {
  rootAttrs: Record<string, string | number | number[]>;
  grid: Grid3;
  fields: readonly GridField[];
  particles: readonly H5Array[] | null;
}

type H5 = typeof import('h5wasm/node').default;
let h5promise: Promise<H5> | null = null;
async function loadH5(): Promise<H5> {
  if (!h5promise) h5promise = import('h5wasm/node').then(async (m) => { await m.default.ready; return m.default; });
  return h5promise;
}

/** sha256 (hex) and size of a file, read in chunks. */
export async function hashFile(file: string): Promise<WrittenFile> {
  const hash = createHash('sha256');
  let bytes = 0;
  for await (const chunk of createReadStream(file, { highWaterMark: 1 << 22 })) {
    hash.update(chunk as Buffer);
    bytes += (chunk as Buffer).length;
  }
  return { sha256: hash.digest('hex'), bytes };
}

/** Attribute keys stored as 32-bit integers; every other number is a float64 (h5wasm would guess an integer type for large whole numbers). */
const INTEGER_ATTRS = new Set(['seed', 'shape']);

type AttrTarget = { create_attribute(name: string, data: string | number | Float64Array | Int32Array, shape?: number[] | null, dtype?: string | null): void };

function setAttrs(obj: AttrTarget, attrs: Record<string, string | number | number[]>): void {
  for (const [k, v] of Object.entries(attrs)) {
    const int = INTEGER_ATTRS.has(k);
    if (Array.isArray(v)) obj.create_attribute(k, int ? new Int32Array(v) : new Float64Array(v), null, int ? '<i4' : '<d');
    else if (typeof v === 'number') obj.create_attribute(k, v, null, int ? '<i4' : '<d');
    else obj.create_attribute(k, v);
  }
}

/** Writes the HDF5 file (temp name, then rename); returns its sha256 and size. */
export async function writeHdf5(file: string, content: H5Content, precision: 'float32' | 'float64', force: boolean, stage?: ProgressStage): Promise<WrittenFile> {
  assertWritable(file, force);
  mkdirSync(path.dirname(file), { recursive: true });
  const h5 = await loadH5();
  const tmp = tempName(file);
  rmSync(tmp, { force: true });
  const dtype = precision === 'float32' ? '<f' : '<d';
  const realNow = Date.now;
  Date.now = () => FIXED_CLOCK_MS;
  let f: InstanceType<H5['File']> | null = null;
  try {
    f = new h5.File(tmp, 'w');
    setAttrs(f, content.rootAttrs);
    const { nx, ny, nz } = content.grid;
    const plane = ny * nz;
    const buf = floatArray(precision, plane);
    const grid = f.create_group('grid');
    let done = 0;
    for (const field of content.fields) {
      fillPlane(field, 0, plane, buf);
      const ds = grid.create_dataset({ name: field.name, data: buf, shape: [1, ny, nz], maxshape: [nx, ny, nz], chunks: [1, ny, nz], dtype });
      if (nx > 1) ds.resize([nx, ny, nz]);
      for (let i = 1; i < nx; i++) {
        fillPlane(field, i, plane, buf);
        ds.write_slice([[i, i + 1]], buf);
        stage?.update(++done);
      }
      stage?.update(++done);
      setAttrs(ds, { unit: field.unit, to_cgs: field.toCgs, quantity: field.kind, description: field.description });
    }
    if (content.particles) {
      const pg = f.create_group('particles');
      for (const a of content.particles) {
        const rows = a.shape[0]!;
        const per = a.shape.length > 1 ? a.shape[1]! : 1;
        const chunkRows = Math.max(1, Math.min(rows, Math.floor((1 << 20) / per)));
        const first = Math.min(rows, chunkRows);
        const firstData = floatArray(precision, first * per);
        firstData.set(a.data.subarray(0, first * per));
        const shape0 = per > 1 ? [first, per] : [first];
        const ds = pg.create_dataset({ name: a.name, data: firstData, shape: shape0, maxshape: a.shape, chunks: per > 1 ? [chunkRows, per] : [chunkRows], dtype });
        if (rows > first) {
          ds.resize(a.shape);
          for (let r = first; r < rows; r += chunkRows) {
            const r1 = Math.min(rows, r + chunkRows);
            const part = floatArray(precision, (r1 - r) * per);
            part.set(a.data.subarray(r * per, r1 * per));
            ds.write_slice([[r, r1]], part);
          }
        }
        setAttrs(ds, a.attrs);
      }
    }
    f.close();
    f = null;
  } catch (e) {
    try { f?.close(); } catch { /* already failing */ }
    rmSync(tmp, { force: true });
    throw e;
  } finally {
    Date.now = realNow;
  }
  const written = await hashFile(tmp);
  try {
    renameSync(tmp, file);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
  return written;
}
