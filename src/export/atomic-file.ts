/**
 * Safe file output: every file is written under a temporary name in the same folder and
 * renamed when complete, so an interrupted run never leaves a half file under a final name.
 * Existing outputs are replaced only with `force`.
 */
import { createWriteStream, existsSync, mkdirSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import path from 'node:path';
import { InputError } from '../input-error.js';

/** Temporary name beside a final path. */
export function tempName(finalPath: string): string {
  return path.join(path.dirname(finalPath), `.${path.basename(finalPath)}.${process.pid}.tmp`);
}

/** Throws InputError if the path exists and force is off. */
export function assertWritable(finalPath: string, force: boolean): void {
  if (!force && existsSync(finalPath)) throw new InputError(`${finalPath}: already exists (use --force to replace it)`);
}

/** Writes bytes or text atomically; returns the sha256 (hex) of what was written. */
export function writeFileAtomic(finalPath: string, data: string | Uint8Array, force: boolean): string {
  assertWritable(finalPath, force);
  mkdirSync(path.dirname(finalPath), { recursive: true });
  const tmp = tempName(finalPath);
  try {
    writeFileSync(tmp, data);
    renameSync(tmp, finalPath);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
  return createHash('sha256').update(data).digest('hex');
}

/** A streaming writer to a temporary name: write chunks, then commit (rename) or abort. */
export interface AtomicStream {
  /** Writes a chunk; `stable`: the caller never changes these bytes again, so they are not copied. */
  write(chunk: Uint8Array, stable?: boolean): Promise<void>;
  /** Flushes, renames to the final name and returns the sha256 (hex) of all bytes written. */
  commit(): Promise<string>;
  abort(): void;
}

/** Opens a streaming atomic writer for finalPath (refuses an existing file without force). */
export function openAtomicStream(finalPath: string, force: boolean): AtomicStream {
  assertWritable(finalPath, force);
  mkdirSync(path.dirname(finalPath), { recursive: true });
  const tmp = tempName(finalPath);
  const out = createWriteStream(tmp);
  const hash = createHash('sha256');
  let failed: Error | null = null;
  out.on('error', (e) => { failed = e; });
  return {
    write: (chunk, stable = false) =>
      new Promise<void>((resolve, reject) => {
        if (failed) return reject(failed);
        hash.update(chunk);
        // copy unless stable: the caller may reuse its buffer once the promise resolves
        const data = stable ? Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength) : Buffer.from(chunk);
        const ok = out.write(data, (err) => (err ? reject(err) : undefined));
        if (ok) resolve();
        else out.once('drain', () => resolve());
      }),
    commit: () =>
      new Promise<string>((resolve, reject) => {
        out.end(() => {
          if (failed) { rmSync(tmp, { force: true }); return reject(failed); }
          try {
            renameSync(tmp, finalPath);
            resolve(hash.digest('hex'));
          } catch (e) {
            rmSync(tmp, { force: true });
            reject(e as Error);
          }
        });
      }),
    abort: () => {
      out.destroy();
      rmSync(tmp, { force: true });
    },
  };
}
