import { describe, it, expect, beforeAll } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { loadCube, loadVelocityCubes } from '../src/survey/load-cube.js';
import { encodeNpy } from '../src/export/npy.js';
import { InputError } from '../src/input-error.js';

let dir: string;
const file = (name: string, bytes: Uint8Array) => { const p = path.join(dir, name); writeFileSync(p, bytes); return p; };
const bytesOf = (a: Float32Array | Float64Array) => new Uint8Array(a.buffer);

describe('loadCube', () => {
  beforeAll(() => { dir = mkdtempSync(path.join(tmpdir(), 'fragplan-cube-')); });

  it('reads a float64 .npy cube as float32 with its shape', () => {
    const a = Float64Array.from({ length: 24 }, (_, i) => 1 + i);
    const c = loadCube(file('a.npy', encodeNpy(a, [2, 3, 4])));
    expect(c.shape).toEqual([2, 3, 4]);
    expect(Array.from(c.density)).toEqual(Array.from(a));
  });

  it('reads a raw cube with shape and dtype', () => {
    const a = Float32Array.from({ length: 8 }, (_, i) => 0.5 + i);
    expect(Array.from(loadCube(file('a.raw', bytesOf(a)), { shape: [2, 2, 2], dtype: 'float32' }).density)).toEqual(Array.from(a));
  });

  it('refuses bad cubes with an InputError naming the file', () => {
    const cases: Array<[string, Uint8Array, Parameters<typeof loadCube>[1], RegExp]> = [
      ['raw-no-shape.raw', bytesOf(new Float32Array(8).fill(1)), {}, /--shape/],
      ['raw-size.raw', bytesOf(new Float32Array(7).fill(1)), { shape: [2, 2, 2] }, /needs 32/],
      ['flat.npy', encodeNpy(new Float32Array(8).fill(1), [8]), {}, /3D cube/],
      ['int.npy', encodeNpy(new Int32Array(8).fill(1), [2, 2, 2]), {}, /dtype/],
      ['nan.npy', encodeNpy(Float32Array.from([1, 1, NaN, 1, 1, 1, 1, 1]), [2, 2, 2]), {}, /not finite/],
      ['neg.npy', encodeNpy(Float32Array.from([1, 1, 1, -1, 1, 1, 1, 1]), [2, 2, 2]), {}, /not positive/],
      ['big.npy', encodeNpy(Float64Array.from([1, 1, 1, 1e300, 1, 1, 1, 1]), [2, 2, 2]), {}, /float32 range/],
    ];
    for (const [name, bytes, opts, msg] of cases) {
      const p = file(name, bytes);
      expect(() => loadCube(p, opts)).toThrow(InputError);
      expect(() => loadCube(p, opts)).toThrow(msg);
      expect(() => loadCube(p, opts)).toThrow(name);
    }
    expect(() => loadCube(path.join(dir, 'missing.npy'))).toThrow(/no such file/);
  });

  it('accepts negative velocities and refuses a velocity cube of another shape', () => {
    const v = Float32Array.from({ length: 8 }, (_, i) => i - 4);
    const p = file('v.npy', encodeNpy(v, [2, 2, 2]));
    const [vx] = loadVelocityCubes([p, p, p], [2, 2, 2]);
    expect(Array.from(vx)).toEqual(Array.from(v));
    expect(() => loadVelocityCubes([p, p, p], [2, 2, 4])).toThrow(/differs/);
  });
});
