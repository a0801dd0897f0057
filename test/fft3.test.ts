import { describe, it, expect } from 'vitest';
import { pythonJson } from './helpers/python.js';
import { realForward3, realInverse3, halfSpectrumLength, halfLength, complexAxis, axisLineCount, signedWavenumber, bandColumns, bandSpectrumLength, inverseZ } from '../src/grid/fft3.js';
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

  it('a complex pass split into ranges (cutting blocks) gives the bytes of one whole pass', () => {
    const g = { nx: 8, ny: 16, nz: 32, boxSize: 1 };
    const spec = realForward3(pseudoRandom(8 * 16 * 32, 5), g);
    for (const axis of [0, 1] as const) {
      const whole = spec.slice();
      complexAxis(whole, g, axis, true);
      const split = spec.slice();
      const n = axisLineCount(g, axis);
      for (const [a, b] of [[0, 7], [7, 40], [40, n]]) complexAxis(split, g, axis, true, a, b);
      expect(Buffer.from(split.buffer).equals(Buffer.from(whole.buffer))).toBe(true);
    }
  });

  it('the band hint gives the same bytes as no hint, and matches numpy.fft.irfftn', () => {
    // A band-limited spectrum: random modes with |kx|, |ky| <= 3 and 1 <= kz <= 3 (kz = 0 left +0 so that the
    // half spectrum is Hermitian-consistent), +0 elsewhere, so most lines are zero.
    const g = { nx: 16, ny: 8, nz: 16, boxSize: 1 };
    const nh = halfLength(g.nz);
    const band = 3.5;
    const spec = new Float64Array(halfSpectrumLength(g));
    const r = pseudoRandom(spec.length, 9);
    for (let i = 0; i < g.nx; i++) for (let j = 0; j < g.ny; j++) for (let c = 0; c < nh; c++) {
      if (Math.abs(signedWavenumber(i, g.nx)) > band || Math.abs(signedWavenumber(j, g.ny)) > band || c > band || c === 0) continue;
      const idx = ((i * g.ny + j) * nh + c) * 2;
      spec[idx] = r[idx]!;
      spec[idx + 1] = r[idx + 1]!;
    }
    const plain = new Float64Array(g.nx * g.ny * g.nz);
    realInverse3(spec.slice(), g, plain);
    const hinted = new Float64Array(plain.length);
    realInverse3(spec.slice(), g, hinted, band);
    expect(Buffer.from(hinted.buffer).equals(Buffer.from(plain.buffer))).toBe(true);
    // The band spectrum (kz columns 0..band + 1 only) gives the same bytes too
    const nc = bandColumns(g, band);
    expect(nc).toBe(5);
    const compact = new Float64Array(bandSpectrumLength(g, band));
    for (let line = 0; line < g.nx * g.ny; line++) compact.set(spec.subarray(line * nh * 2, line * nh * 2 + nc * 2), line * nc * 2);
    const banded = new Float64Array(plain.length);
    realInverse3(compact, g, banded, band);
    expect(Buffer.from(banded.buffer).equals(Buffer.from(plain.buffer))).toBe(true);
    // the z pass over line ranges, and a lone line (no partner), read the band spectrum as the full one
    const full = spec.slice();
    complexAxis(full, g, 0, true);
    complexAxis(full, g, 1, true);
    const compact2 = new Float64Array(bandSpectrumLength(g, band));
    for (let line = 0; line < g.nx * g.ny; line++) compact2.set(spec.subarray(line * nh * 2, line * nh * 2 + nc * 2), line * nc * 2);
    complexAxis(compact2, g, 0, true, 0, -1, band);
    complexAxis(compact2, g, 1, true, 0, -1, band);
    for (const [a, b] of [[0, 8], [8, 64], [64, 101], [101, g.nx * g.ny]]) {
      const want = new Float64Array(plain.length), got = new Float64Array(plain.length);
      inverseZ(full, want, g, a, b);
      inverseZ(compact2, got, g, a, b, band);
      expect(Buffer.from(got.buffer).equals(Buffer.from(want.buffer))).toBe(true);
    }
    // a band spectrum too narrow for the hint is refused
    expect(() => realInverse3(new Float64Array(bandSpectrumLength(g, 1)), g, banded, band)).toThrow(RangeError);
    // Reference: numpy.fft.irfftn (pocketfft) of the same half spectrum.
    const py = `import sys,json,numpy as np
d=np.array(json.loads(sys.stdin.read())).reshape(16,8,${nh},2)
print(json.dumps([float(x) for x in np.fft.irfftn(d[...,0]+1j*d[...,1],s=(16,8,16)).ravel()]))`;
    const out = pythonJson<number[]>(py, JSON.stringify(Array.from(spec)));
    let err = 0;
    for (let i = 0; i < out.length; i++) err = Math.max(err, Math.abs(out[i]! - hinted[i]!));
    expect(err).toBeLessThan(1e-12);
  });
});
