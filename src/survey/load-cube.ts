/**
 * Reading a cube for `fragplan survey`: a NumPy .npy file (read by src/export/npy.ts), or a
 * raw little-endian file whose shape and dtype are given. Checked: dtype (float32 or float64),
 * three dimensions, byte size, finite values (and for density: every value > 0, within the
 * float32 range). Every problem is an InputError naming the file.
 *
 * Cube conventions: shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k, i along x,
 * cell-centred; values are returned as Float32Array in the file's own unit.
 */
import { readFileSync, statSync } from 'node:fs';
import { InputError } from '../input-error.js';
import { decodeNpy } from '../export/npy.js';

/** Largest cube file we read, bytes (16 GiB). */
export const MAX_CUBE_BYTES = 16 * 2 ** 30;

/** Options of loadCube: shape and dtype for raw files; kind selects the value checks. */
export interface LoadCubeOptions {
  shape?: [number, number, number];
  dtype?: 'float32' | 'float64';
  /** 'density' (default): values must be finite and > 0; 'velocity': finite. */
  kind?: 'density' | 'velocity';
}

const FLOAT32_MAX = 3.4028234663852886e38;

/** Reads and validates a 3D cube (.npy, or raw with shape and dtype); returns Float32 values and the shape (nx, ny, nz). */
export function loadCube(file: string, opts: LoadCubeOptions = {}): { density: Float32Array; shape: [number, number, number] } {
  let size: number;
  try {
    const st = statSync(file);
    if (!st.isFile()) throw new Error('not a file');
    size = st.size;
  } catch {
    throw new InputError(`${file}: no such file`);
  }
  if (size > MAX_CUBE_BYTES) throw new InputError(`${file}: ${size} bytes is larger than the ${MAX_CUBE_BYTES}-byte limit`);
  const bytes = readFileSync(file);
  const isNpy = bytes.length >= 6 && bytes[0] === 0x93 && bytes.subarray(1, 6).toString('latin1') === 'NUMPY';
  let data: Float32Array | Float64Array;
  let shape: number[];
  if (isNpy) {
    const a = decodeNpy(bytes, file);
    if (a.dtype !== 'float32' && a.dtype !== 'float64') throw new InputError(`${file}: dtype ${a.dtype} not supported (expected float32 or float64)`);
    if (opts.shape && opts.shape.join() !== a.shape.join()) throw new InputError(`${file}: the file's shape (${a.shape.join(', ')}) differs from the given shape (${opts.shape.join(', ')})`);
    data = a.data as Float32Array | Float64Array;
    shape = a.shape;
  } else {
    if (!opts.shape) throw new InputError(`${file}: not a .npy file; a raw cube needs --shape nx,ny,nz and --dtype float32|float64`);
    const dtype = opts.dtype ?? 'float32';
    if (dtype !== 'float32' && dtype !== 'float64') throw new InputError(`${file}: dtype "${String(dtype)}" not supported (expected float32 or float64)`);
    shape = opts.shape;
    const per = dtype === 'float32' ? 4 : 8;
    const n = shape.reduce((x, y) => x * y, 1);
    if (bytes.length !== n * per) throw new InputError(`${file}: ${bytes.length} bytes, but shape (${shape.join(', ')}) of ${dtype} needs ${n * per}`);
    const copy = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.length);
    data = dtype === 'float32' ? new Float32Array(copy) : new Float64Array(copy);
  }
  if (shape.length !== 3) throw new InputError(`${file}: expected a 3D cube, got ${shape.length} dimension(s) (${shape.join(', ')})`);
  if (shape.some((s) => s < 1)) throw new InputError(`${file}: empty cube (shape ${shape.join(', ')})`);
  const kind = opts.kind ?? 'density';
  const out = data instanceof Float32Array ? data : new Float32Array(data.length);
  for (let i = 0; i < data.length; i++) {
    const v = data[i]!;
    if (!Number.isFinite(v)) throw new InputError(`${file}: value ${v} at flat index ${i} is not finite`);
    if (kind === 'density' && !(v > 0)) throw new InputError(`${file}: density ${v} at flat index ${i} is not positive`);
    if (Math.abs(v) > FLOAT32_MAX) throw new InputError(`${file}: value ${v} at flat index ${i} is outside the float32 range`);
    if (out !== data) {
      out[i] = v;
      if (kind === 'density' && !(out[i]! > 0)) throw new InputError(`${file}: density ${v} at flat index ${i} underflows float32`);
    }
  }
  return { density: out, shape: [shape[0]!, shape[1]!, shape[2]!] };
}

/** Reads three velocity cubes (cm/s or the file's unit) that must match the density shape. */
export function loadVelocityCubes(files: readonly string[], shape: readonly [number, number, number], opts: Omit<LoadCubeOptions, 'kind'> = {}): [Float32Array, Float32Array, Float32Array] {
  if (files.length !== 3) throw new InputError(`velocity: expected three files vx,vy,vz, got ${files.length}`);
  const out = files.map((f) => {
    const c = loadCube(f, { ...opts, shape: opts.shape, kind: 'velocity' });
    if (c.shape.join() !== shape.join()) throw new InputError(`${f}: shape (${c.shape.join(', ')}) differs from the density cube's (${shape.join(', ')})`);
    return c.density;
  });
  return [out[0]!, out[1]!, out[2]!];
}
