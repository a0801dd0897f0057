import { describe, it, expect } from 'vitest';
import { pythonJson } from './helpers/python.js';
import { realForward3, realInverse3, halfSpectrumLength, halfLength } from '../src/grid/fft3.js';
import { cubicGrid } from '../src/grid/grid3.js';

function pseudoRandom(n: number, seed = 7): Float32Array {
  const a = new Float32Array(n);
  let s = seed;
  for (let i = 0; i < n; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    a[i] = s / 2 ** 32 - 0.5;
  }
  return a;
}

describe('real 3D FFT', () => {
  it('inverse(forward(f)) returns f', () => {
    const g = cubicGrid(16, 1);
    const f = pseudoRandom(16 ** 3);
    const spec = realForward3(f, g);
    const back = new Float64Array(f.length);
    realInverse3(spec, g, back);
    let err = 0;
    for (let i = 0; i < f.length; i++) err = Math.max(err, Math.abs(back[i]! - f[i]!));
    expect(err).toBeLessThan(1e-6);
  });

  it('matches numpy.fft.rfftn on the same data', () => {
    // Reference: numpy.fft.rfftn (pocketfft), the general-purpose reference library.
    const g = { nx: 8, ny: 4, nz: 16, boxSize: 1 };
    const f = pseudoRandom(8 * 4 * 16, 3);
    const spec = realForward3(f, g);
    expect(spec.length).toBe(halfSpectrumLength(g));
    const py = `import sys,json,numpy as np
a=np.array(json.loads(sys.stdin.read()),dtype=np.float64).reshape(8,4,16)
s=np.fft.rfftn(a)
print(json.dumps([float(x) for x in np.stack([s.real,s.imag],-1).ravel()]))`;
    const out = pythonJson<number[]>(py, JSON.stringify(Array.from(f)));
    expect(out.length).toBe(8 * 4 * halfLength(16) * 2);
    let err = 0;
    for (let i = 0; i < out.length; i++) err = Math.max(err, Math.abs(out[i]! - spec[i]!));
    expect(err).toBeLessThan(1e-9);
  });
});
