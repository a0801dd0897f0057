/**
 * One float32 grid field written whole, synchronously (the task a worker thread runs, so the
 * writing and hashing of the initial-condition files do not wait on the main thread): header, then
 * the values as they are in memory (little-endian), through a temporary name renamed on completion.
 * The same bytes as writeFieldStream writes for a float32 field with scale 1.
 */
import { closeSync, mkdirSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { createHash } from 'node:crypto';
import path from 'node:path';
import { assertWritable, tempName } from './atomic-file.js';
import type { WrittenFile } from './grid-stream.js';

/** Bytes written per call. */
const CHUNK = 4 << 20;

/** Writes header + values (Float32, e.g. on shared memory) to `file` atomically (refuses an existing file without force); returns its sha256 (hex) and size in bytes. */
export function writeFieldFile(file: string, header: Uint8Array, values: Float32Array, force: boolean): WrittenFile {
  assertWritable(file, force);
  mkdirSync(path.dirname(file), { recursive: true });
  const tmp = tempName(file);
  const hash = createHash('sha256');
  const bytes = new Uint8Array(values.buffer, values.byteOffset, values.byteLength);
  let fd = -1;
  try {
    fd = openSync(tmp, 'w');
    const put = (b: Uint8Array): void => {
      hash.update(b);
      for (let o = 0; o < b.length;) o += writeSync(fd, b, o, b.length - o);
    };
    put(header);
    for (let o = 0; o < bytes.length; o += CHUNK) put(bytes.subarray(o, Math.min(bytes.length, o + CHUNK)));
    closeSync(fd);
    fd = -1;
    renameSync(tmp, file);
  } catch (e) {
    if (fd >= 0) closeSync(fd);
    rmSync(tmp, { force: true });
    throw e;
  }
  return { sha256: hash.digest('hex'), bytes: header.length + bytes.length };
}
