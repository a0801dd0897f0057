/**
 * The scratch spectrum's zero-fill bound (forBand's dirtyKz, bandInverseDirtyKz): a spectrum that
 * held a band-limited inverse transform is +0 above the band, and filling modes into it while
 * zeroing only up to that bound gives the same bytes as filling a fresh array.
 */
import { describe, it, expect } from 'vitest';
import { fillLogDensityModes, fillVelocityComponent } from '../src/generate/modes.js';
import { bandInverseDirtyKz, halfLength, halfSpectrumLength, realInverse3 } from '../src/grid/fft3.js';
import { cubicGrid } from '../src/grid/grid3.js';
import { seedKey } from '../src/grid/random-field.js';

const bytes = (a: Float64Array): Buffer => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

describe('scratch spectrum reuse', () => {
  const g = cubicGrid(32, 1);
  const nh = halfLength(g.nz);
  const key = seedKey(3);

  it('after a band-limited inverse, every mode above the band is +0', () => {
    for (const band of [4, 9, 15]) {
      const spec = new Float64Array(halfSpectrumLength(g));
      fillLogDensityModes(0, g.nx, spec, g, { key, index: 11 / 3, kMin: 1, kMax: band, coupling: 0.5 }, -1);
      realInverse3(spec, g, new Float32Array(32 ** 3), band);
      const dirty = bandInverseDirtyKz(g, band);
      expect(dirty).toBe(band);
      let bad = 0;
      for (let r = 0; r < g.nx * g.ny; r++) for (let c = dirty + 1; c < nh; c++) {
        const re = spec[(r * nh + c) * 2]!, im = spec[(r * nh + c) * 2 + 1]!;
        if (!(re === 0 && 1 / re > 0 && im === 0 && 1 / im > 0)) bad++;
      }
      expect(bad).toBe(0);
      // and below the band it is not (the check above could not pass on an untouched array)
      expect(spec.some((v) => v !== 0)).toBe(true);
    }
  });

  it('filling a used spectrum with the bound gives the bytes of a fresh fill, whichever band is wider', () => {
    for (const [first, second] of [[12, 5], [5, 12]] as const) {
      const used = new Float64Array(halfSpectrumLength(g));
      fillLogDensityModes(0, g.nx, used, g, { key, index: 11 / 3, kMin: 1, kMax: first, coupling: 0.5 }, -1);
      realInverse3(used, g, new Float32Array(32 ** 3), first);
      const p = { key, index: 4, kMin: 1, kMax: second, zeta: 0.5 };
      fillVelocityComponent(0, g.nx, used, 1, g, p, bandInverseDirtyKz(g, first));
      const fresh = new Float64Array(halfSpectrumLength(g));
      fillVelocityComponent(0, g.nx, fresh, 1, g, p, -1);
      expect(Buffer.compare(bytes(used), bytes(fresh))).toBe(0);
    }
  });

  it('a bound at the top zeroes everything (the default)', () => {
    const spec = new Float64Array(halfSpectrumLength(g)).fill(3);
    fillVelocityComponent(0, g.nx, spec, 0, g, { key, index: 4, kMin: 1, kMax: 6, zeta: 1 });
    const fresh = new Float64Array(halfSpectrumLength(g));
    fillVelocityComponent(0, g.nx, fresh, 0, g, { key, index: 4, kMin: 1, kMax: 6, zeta: 1 }, -1);
    expect(Buffer.compare(bytes(spec), bytes(fresh))).toBe(0);
  });
});
