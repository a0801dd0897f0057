/**
 * writeFieldFile: a whole float32 field as .npy/.raw bytes (header, then the values little-endian),
 * with direct I/O (block-aligned chunks, the last padded, the file cut to size) or buffered; the
 * sha256 is recomputed here with node:crypto (FIPS 180-4).
 */
import { describe, it, expect, beforeEach, afterEach } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { writeFieldFile } from '../src/export/field-file.js';
import { npyHeader, decodeNpy } from '../src/export/npy.js';

describe('writeFieldFile', () => {
  let dir: string;
  beforeEach(() => { dir = mkdtempSync(path.join(tmpdir(), 'fragplan-field-')); });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  // sizes below, at and across the 4 MiB chunk and the 4096-byte alignment
  for (const n of [0, 1, 1023, 1 << 20, (1 << 20) + 333, 3 * (1 << 20) + 77]) {
    it(`writes ${n} values with the header, direct and buffered alike`, () => {
      const values = new Float32Array(new SharedArrayBuffer(4 * n));
      for (let i = 0; i < n; i++) values[i] = Math.sin(i) * 1e-20;
      const header = npyHeader('float32', [n]);
      const want = Buffer.concat([Buffer.from(header), Buffer.from(values.buffer)]);
      for (const direct of [true, false]) {
        const file = path.join(dir, `f-${direct}.npy`);
        const w = writeFieldFile(file, header, values, false, direct);
        const got = readFileSync(file);
        expect(got.equals(want)).toBe(true);
        expect(w.bytes).toBe(want.length);
        expect(w.sha256).toBe(createHash('sha256').update(got).digest('hex'));
        const back = decodeNpy(new Uint8Array(got));
        expect(back.shape).toEqual([n]);
      }
      expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
    });
  }

  it('refuses to replace an existing file without force, and replaces it with force', () => {
    const file = path.join(dir, 'density.npy');
    writeFileSync(file, 'keep');
    const values = new Float32Array([1, 2, 3]);
    expect(() => writeFieldFile(file, npyHeader('float32', [3]), values, false)).toThrow(/already exists/);
    expect(readFileSync(file, 'utf8')).toBe('keep');
    writeFieldFile(file, npyHeader('float32', [3]), values, true);
    expect(Array.from(decodeNpy(new Uint8Array(readFileSync(file))).data)).toEqual([1, 2, 3]);
  });
});
