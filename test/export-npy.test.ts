/** npy.ts: our NumPy format 1.0 writer and reader (NEP 1) round-trip through files. */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { encodeNpy, decodeNpy, readNpy, npyHeader } from '../src/export/npy.js';
import { InputError } from '../src/input-error.js';

describe('npy', () => {
  it('headers are a multiple of 64 bytes and end with a newline', () => {
    for (const shape of [[0], [1], [3, 4, 5], [512, 512, 512]]) {
      const h = npyHeader('float32', shape);
      expect(h.length % 64).toBe(0);
      expect(h[h.length - 1]).toBe(0x0a);
    }
  });

  it('an empty array and a one-element array round-trip', () => {
    expect(decodeNpy(encodeNpy(new Float32Array(0), [0])).data.length).toBe(0);
    expect(Array.from(decodeNpy(encodeNpy(new Float64Array([2.5]), [1])).data)).toEqual([2.5]);
  });

  it('reads back a file written with our encoder (a Buffer whose pool offset is not zero)', () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'fragplan-npyrt-'));
    try {
      const a = new Float32Array(60).map((_, i) => i * 1.5 - 7);
      const f = path.join(dir, 'a.npy');
      writeFileSync(f, encodeNpy(a, [3, 4, 5]));
      const r = readNpy(f);
      expect(r.shape).toEqual([3, 4, 5]);
      expect(r.dtype).toBe('float32');
      expect(Array.from(r.data)).toEqual(Array.from(a));
      const small = Buffer.concat([Buffer.from('xyz'), Buffer.from(encodeNpy(new Float64Array([1, 2, 3]), [3]))]).subarray(3);
      expect(Array.from(decodeNpy(small).data)).toEqual([1, 2, 3]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('rejects bad magic, truncated data and shape mismatches', () => {
    expect(() => decodeNpy(new Uint8Array(20))).toThrow(InputError);
    const ok = encodeNpy(new Float32Array(8), [2, 4]);
    expect(() => decodeNpy(ok.subarray(0, ok.length - 4))).toThrow(/expected 32 data bytes/);
    expect(() => encodeNpy(new Float32Array(8), [3, 3])).toThrow(RangeError);
  });
});
