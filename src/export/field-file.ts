/**
 * One float32 grid field written whole, synchronously (the task a worker thread runs, so the
 * writing and hashing of the initial-condition files do not wait on the main thread): header, then
 * the values as they are in memory (little-endian), through a temporary name renamed on completion.
 * The same bytes as writeFieldStream writes for a float32 field with scale 1.
 *
 * The bytes go to the disk with direct I/O (O_DIRECT) where the file system takes it: large files
 * written once and read later by another program gain nothing from the page cache, and filling it
 * is what costs here (on this project's virtual machine a buffered 320 MiB write took 0.1-2.2 s,
 * a direct one 0.19-0.24 s). Direct I/O needs block-aligned memory, offsets and lengths: the data
 * pass through a page-aligned staging buffer (a WebAssembly memory, which the engine allocates by
 * pages) in 4 MiB chunks, the last one padded with zeros, and the file is cut to its size at the
 * end. Where the file system refuses direct I/O (EINVAL), or FRAGPLAN_DIRECT_IO=0 is set (on a slow
 * disk a buffered write returns sooner, the kernel writing it back later), the file is written the
 * ordinary way.
 */
import { closeSync, constants, ftruncateSync, mkdirSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { createHash } from 'node:crypto';
import path from 'node:path';
import { assertWritable, tempName } from './atomic-file.js';
import type { WrittenFile } from './grid-stream.js';

/** Bytes written per call (a multiple of ALIGN). */
const CHUNK = 4 << 20;
/** Alignment direct I/O asks for (the largest usual logical block size). */
const ALIGN = 4096;
/** WebAssembly memory page, bytes. */
const WASM_PAGE = 65536;

let staging: Uint8Array | null = null;

/** The page-aligned staging buffer of CHUNK bytes (one per thread, reused). */
function stagingBuffer(): Uint8Array {
  staging ??= new Uint8Array(new WebAssembly.Memory({ initial: CHUNK / WASM_PAGE, maximum: CHUNK / WASM_PAGE }).buffer);
  return staging;
}

/** Writes all of b at the file's current position (buffered file). */
function writeAll(fd: number, b: Uint8Array): void {
  for (let o = 0; o < b.length;) o += writeSync(fd, b, o, b.length - o);
}

/** The file's bytes (header, then data) written through the staging buffer to a file opened with O_DIRECT; false if the first write is refused (EINVAL). */
function writeDirect(fd: number, header: Uint8Array, data: Uint8Array): boolean {
  const buf = stagingBuffer();
  const total = header.length + data.length;
  let pos = 0; // file offset of buf[0]
  let fill = 0;
  let src = 0; // bytes of header + data copied so far
  const take = (from: Uint8Array, start: number, n: number): void => { buf.set(from.subarray(start, start + n), fill); fill += n; src += n; };
  while (src < total) {
    const room = CHUNK - fill;
    if (src < header.length) take(header, src, Math.min(room, header.length - src));
    else take(data, src - header.length, Math.min(room, total - src));
    if (fill < CHUNK && src < total) continue;
    // a full chunk, or the last one padded to the alignment
    const len = Math.ceil(fill / ALIGN) * ALIGN;
    buf.fill(0, fill, len);
    try {
      for (let o = 0; o < len;) o += writeSync(fd, buf, o, len - o, pos + o);
    } catch (e) {
      if (pos === 0 && (e as NodeJS.ErrnoException).code === 'EINVAL') return false;
      throw e;
    }
    pos += len;
    fill = 0;
  }
  ftruncateSync(fd, total);
  return true;
}

/** Opens path for writing with O_DIRECT, or returns -1 when the file system refuses it (EINVAL). */
function openDirect(file: string): number {
  try {
    return openSync(file, constants.O_WRONLY | constants.O_CREAT | constants.O_TRUNC | (constants.O_DIRECT ?? 0));
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'EINVAL') return -1;
    throw e;
  }
}

/**
 * Writes header + values (Float32, e.g. on shared memory) to `file` atomically (refuses an existing
 * file without force), with direct I/O unless `direct` is false (default: unless FRAGPLAN_DIRECT_IO=0)
 * or refused; returns its sha256 (hex) and size in bytes.
 */
export function writeFieldFile(file: string, header: Uint8Array, values: Float32Array, force: boolean, direct = process.env.FRAGPLAN_DIRECT_IO !== '0'): WrittenFile {
  assertWritable(file, force);
  mkdirSync(path.dirname(file), { recursive: true });
  const tmp = tempName(file);
  const data = new Uint8Array(values.buffer, values.byteOffset, values.byteLength);
  let fd = -1;
  try {
    fd = !direct || constants.O_DIRECT === undefined ? -1 : openDirect(tmp);
    if (fd < 0 || !writeDirect(fd, header, data)) {
      if (fd >= 0) closeSync(fd);
      fd = openSync(tmp, 'w');
      writeAll(fd, header);
      for (let o = 0; o < data.length; o += CHUNK) writeAll(fd, data.subarray(o, Math.min(data.length, o + CHUNK)));
    }
    closeSync(fd);
    fd = -1;
    renameSync(tmp, file);
  } catch (e) {
    if (fd >= 0) closeSync(fd);
    rmSync(tmp, { force: true });
    throw e;
  }
  return { sha256: createHash('sha256').update(header).update(data).digest('hex'), bytes: header.length + data.length };
}
