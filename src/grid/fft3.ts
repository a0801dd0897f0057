/**
 * Real 3D FFT on a Grid3 with a half spectrum, built on fft.js.
 *
 * Conventions: real field of shape (nx, ny, nz), C order, index (i*ny + j)*nz + k.
 * Half spectrum: complex, interleaved (re, im) Float64Array of shape (nx, ny, nh) with
 * nh = nz/2 + 1, element ((i*ny + j)*nh + kz)*2. Wavenumber index i maps to the signed
 * integer wavenumber i for i <= nx/2 and i - nx above (same for j); kz runs 0..nz/2.
 * Forward is unnormalised, F(k) = sum_x f(x) exp(-2 pi i k.x / N); the inverse divides by
 * nx ny nz, so inverse(forward(f)) = f. All sizes must be powers of two (>= 2).
 *
 * The passes take a line range [start, end) so that worker threads can share one
 * SharedArrayBuffer-backed spectrum and each transform a slice of the lines.
 */
import FFT from 'fft.js';
import type { Grid3 } from './grid3.js';
import { isPowerOfTwo } from './grid3.js';

const plans = new Map<number, FFT>();
function plan(n: number): FFT {
  let p = plans.get(n);
  if (!p) {
    p = new FFT(n);
    plans.set(n, p);
  }
  return p;
}

/** Number of complex values along z in the half spectrum. */
export function halfLength(nz: number): number {
  return nz / 2 + 1;
}

/** Length of the Float64Array that holds the half spectrum of grid g (2 per complex value). */
export function halfSpectrumLength(g: Grid3): number {
  return g.nx * g.ny * halfLength(g.nz) * 2;
}

/** Signed integer wavenumber for FFT index i on an axis of n cells. */
export function signedWavenumber(i: number, n: number): number {
  return i <= n / 2 ? i : i - n;
}

/** Throws RangeError unless every side is a power of two >= 2. */
export function assertFftShape(g: Grid3): void {
  for (const n of [g.nx, g.ny, g.nz]) {
    if (!isPowerOfTwo(n) || n < 2) throw new RangeError(`FFT needs a power of two >= 2 cells per side, got ${n}`);
  }
}

/** Number of z lines (nx*ny) a z pass works on. */
export function zLineCount(g: Grid3): number {
  return g.nx * g.ny;
}

/** Number of lines a complex pass along axis 0 (x) or 1 (y) works on. */
export function axisLineCount(g: Grid3, axis: 0 | 1): number {
  const nh = halfLength(g.nz);
  return axis === 0 ? g.ny * nh : g.nx * nh;
}

/** Forward real transform of z lines [start, end) of `field` into the half spectrum `spec`. */
export function forwardZ(field: ArrayLike<number>, spec: Float64Array, g: Grid3, start = 0, end = zLineCount(g)): void {
  const { nz } = g;
  const nh = halfLength(nz);
  const p = plan(nz);
  const input = new Float64Array(nz);
  const out = p.createComplexArray() as number[];
  for (let line = start; line < end; line++) {
    const base = line * nz;
    for (let k = 0; k < nz; k++) input[k] = field[base + k]!;
    p.realTransform(out, input);
    const sb = line * nh * 2;
    for (let k = 0; k < nh * 2; k++) spec[sb + k] = out[k]!;
  }
}

/** Complex transform along axis 0 (x) or 1 (y) of lines [start, end) of the half spectrum, in place. */
export function complexAxis(spec: Float64Array, g: Grid3, axis: 0 | 1, inverse: boolean, start = 0, end = axisLineCount(g, axis)): void {
  const { nx, ny } = g;
  const nh = halfLength(g.nz);
  const n = axis === 0 ? nx : ny;
  const stride = axis === 0 ? ny * nh * 2 : nh * 2;
  const p = plan(n);
  const buf = p.createComplexArray() as number[];
  const out = p.createComplexArray() as number[];
  for (let line = start; line < end; line++) {
    // line enumerates (j, kz) for axis 0 and (i, kz) for axis 1
    const outer = Math.floor(line / nh);
    const kz = line - outer * nh;
    const base = axis === 0 ? (outer * nh + kz) * 2 : (outer * ny * nh + kz) * 2;
    for (let a = 0, o = base; a < n; a++, o += stride) {
      buf[2 * a] = spec[o]!;
      buf[2 * a + 1] = spec[o + 1]!;
    }
    if (inverse) p.inverseTransform(out, buf);
    else p.transform(out, buf);
    for (let a = 0, o = base; a < n; a++, o += stride) {
      spec[o] = out[2 * a]!;
      spec[o + 1] = out[2 * a + 1]!;
    }
  }
}

/**
 * Inverse real transform of z lines [start, end) of the half spectrum into `field`.
 * Two real lines are done with one complex transform (Z = A + iB gives a + ib).
 */
export function inverseZ(spec: Float64Array, field: Float32Array | Float64Array, g: Grid3, start = 0, end = zLineCount(g)): void {
  const { nz } = g;
  const nh = halfLength(nz);
  const p = plan(nz);
  const z = p.createComplexArray() as number[];
  const out = p.createComplexArray() as number[];
  for (let line = start; line < end; line += 2) {
    const a = line * nh * 2;
    const hasB = line + 1 < end;
    const b = (line + 1) * nh * 2;
    for (let k = 0; k < nz; k++) {
      // Hermitian extension: X[k] = conj(X[nz - k]) for k > nz/2
      const src = k < nh ? k : nz - k;
      const sgn = k < nh ? 1 : -1;
      const ar = spec[a + 2 * src]!;
      const ai = sgn * spec[a + 2 * src + 1]!;
      const br = hasB ? spec[b + 2 * src]! : 0;
      const bi = hasB ? sgn * spec[b + 2 * src + 1]! : 0;
      z[2 * k] = ar - bi;
      z[2 * k + 1] = ai + br;
    }
    p.inverseTransform(out, z);
    const fa = line * nz;
    for (let k = 0; k < nz; k++) field[fa + k] = out[2 * k]!;
    if (hasB) {
      const fb = (line + 1) * nz;
      for (let k = 0; k < nz; k++) field[fb + k] = out[2 * k + 1]!;
    }
  }
}

/** Forward real 3D FFT of a field, returning (or filling) its half spectrum; single thread. */
export function realForward3(field: ArrayLike<number>, g: Grid3, spec: Float64Array = new Float64Array(halfSpectrumLength(g))): Float64Array {
  assertFftShape(g);
  forwardZ(field, spec, g);
  complexAxis(spec, g, 1, false);
  complexAxis(spec, g, 0, false);
  return spec;
}

/** Inverse real 3D FFT of a half spectrum into `field` (normalised by N); overwrites `spec`; single thread. */
export function realInverse3(spec: Float64Array, g: Grid3, field: Float32Array | Float64Array): void {
  assertFftShape(g);
  complexAxis(spec, g, 0, true);
  complexAxis(spec, g, 1, true);
  inverseZ(spec, field, g);
}
