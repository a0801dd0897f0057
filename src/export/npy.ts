/**
 * NumPy .npy format 1.0, our own reader and writer (format described in NumPy's
 * "A Simple File Format for NumPy Arrays", NEP 1).
 *
 * Layout: magic "\x93NUMPY", version 1.0, little-endian uint16 header length, an ASCII
 * Python-dict header padded with spaces to a multiple of 64 bytes and ended by "\n", then
 * the raw C-order data. We write little-endian only ('<f4', '<f8', '<i4', '<u1').
 */
import { readFileSync, statSync } from 'node:fs';
import { InputError } from '../input-error.js';

/** Element types we read and write. */
export type NpyDtype = 'float32' | 'float64' | 'int32' | 'uint8';

const DESCR: Record<NpyDtype, string> = { float32: '<f4', float64: '<f8', int32: '<i4', uint8: '|u1' };
const BYTES: Record<NpyDtype, number> = { float32: 4, float64: 8, int32: 4, uint8: 1 };

/** Bytes per element of a dtype. */
export function dtypeBytes(d: NpyDtype): number {
  return BYTES[d];
}

/** The .npy header (magic, version, length, dict, padding) for a C-order array. */
export function npyHeader(dtype: NpyDtype, shape: readonly number[]): Uint8Array {
  const shapeText = shape.length === 1 ? `(${shape[0]},)` : `(${shape.join(', ')})`;
  let dict = `{'descr': '${DESCR[dtype]}', 'fortran_order': False, 'shape': ${shapeText}, }`;
  const pre = 10;
  const total = Math.ceil((pre + dict.length + 1) / 64) * 64;
  dict = dict.padEnd(total - pre - 1, ' ') + '\n';
  const out = new Uint8Array(total);
  out.set([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0], 0);
  const len = dict.length;
  out[8] = len & 0xff;
  out[9] = len >> 8;
  for (let i = 0; i < dict.length; i++) out[pre + i] = dict.charCodeAt(i);
  return out;
}

/** Little-endian bytes of a typed array (a view when the platform is little-endian, as Node's are). */
export function littleEndianBytes(a: Float32Array | Float64Array | Int32Array | Uint8Array): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
}

/** A whole .npy file in memory (header + data). */
export function encodeNpy(a: Float32Array | Float64Array | Int32Array | Uint8Array, shape: readonly number[]): Uint8Array {
  const dtype: NpyDtype = a instanceof Float32Array ? 'float32' : a instanceof Float64Array ? 'float64' : a instanceof Int32Array ? 'int32' : 'uint8';
  const n = shape.reduce((x, y) => x * y, 1);
  if (n !== a.length) throw new RangeError(`shape ${shape.join('x')} holds ${n} values, array has ${a.length}`);
  const h = npyHeader(dtype, shape);
  const out = new Uint8Array(h.length + a.byteLength);
  out.set(h, 0);
  out.set(littleEndianBytes(a), h.length);
  return out;
}

/** A parsed .npy array. */
export interface NpyArray {
  dtype: NpyDtype;
  shape: number[];
  data: Float32Array | Float64Array | Int32Array | Uint8Array;
}

/** Parses .npy bytes; throws InputError naming `source` for anything we cannot read. */
export function decodeNpy(bytes: Uint8Array, source = 'array'): NpyArray {
  const magic = [0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59];
  if (bytes.length < 10 || magic.some((b, i) => bytes[i] !== b)) throw new InputError(`${source}: not a NumPy .npy file (bad magic bytes)`);
  const major = bytes[6]!;
  let headerLen: number;
  let pre: number;
  if (major === 1) { headerLen = bytes[8]! | (bytes[9]! << 8); pre = 10; }
  else if (major === 2 || major === 3) { headerLen = (bytes[8]! | (bytes[9]! << 8) | (bytes[10]! << 16)) + bytes[11]! * 2 ** 24; pre = 12; }
  else throw new InputError(`${source}: unsupported .npy version ${major}`);
  const header = new TextDecoder('latin1').decode(bytes.subarray(pre, pre + headerLen));
  const descr = /'descr':\s*'([^']+)'/.exec(header)?.[1];
  const fortran = /'fortran_order':\s*(True|False)/.exec(header)?.[1];
  const shapeText = /'shape':\s*\(([^)]*)\)/.exec(header)?.[1];
  if (!descr || !fortran || shapeText === undefined) throw new InputError(`${source}: cannot read the .npy header`);
  if (fortran === 'True') throw new InputError(`${source}: Fortran-order arrays are not supported (save with C order)`);
  const dtype = (Object.keys(DESCR) as NpyDtype[]).find((d) => DESCR[d] === descr || (d === 'uint8' && descr === '<u1'));
  if (!dtype) throw new InputError(`${source}: dtype ${descr} not supported (expected little-endian float32 or float64)`);
  const shape = shapeText.split(',').map((s) => s.trim()).filter((s) => s.length).map(Number);
  if (shape.some((s) => !Number.isInteger(s) || s < 0)) throw new InputError(`${source}: bad shape (${shapeText})`);
  const n = shape.reduce((x, y) => x * y, 1);
  const start = pre + headerLen;
  const need = n * BYTES[dtype];
  if (bytes.length - start !== need) throw new InputError(`${source}: expected ${need} data bytes for shape (${shape.join(', ')}) ${descr}, found ${bytes.length - start}`);
  // a real copy (Buffer.prototype.slice returns a view on a shared pool, not a copy)
  const copy = Uint8Array.prototype.slice.call(bytes, start, start + need);
  const data = dtype === 'float32' ? new Float32Array(copy.buffer) : dtype === 'float64' ? new Float64Array(copy.buffer) : dtype === 'int32' ? new Int32Array(copy.buffer) : copy;
  return { dtype, shape, data };
}

/** Reads a .npy file, refusing files larger than maxBytes. */
export function readNpy(file: string, maxBytes = 16 * 2 ** 30): NpyArray {
  let size: number;
  try {
    size = statSync(file).size;
  } catch {
    throw new InputError(`${file}: no such file`);
  }
  if (size > maxBytes) throw new InputError(`${file}: ${size} bytes is larger than the ${maxBytes}-byte limit`);
  return decodeNpy(readFileSync(file), file);
}
