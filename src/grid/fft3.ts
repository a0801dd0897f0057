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
 *
 * Band spectra: an inverse transform with a band hint (complexAxis) may keep only the first
 * nc = bandColumns(g, band) kz columns, element ((i*ny + j)*nc + kz)*2 (the column count is read
 * from the array's length). Under the hint every column above the band holds the same values
 * (the transform of the +0 modes), so column band + 1 stands for them all: the same numbers as the
 * full half spectrum in a quarter of the memory at kz_max = nz/8.
 */
import FFT from 'fft.js';
import type { Grid3 } from './grid3.js';
import { isPowerOfTwo } from './grid3.js';
import { transformBatch } from './fft-batch.js';

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

/** kz columns a band spectrum keeps for `band` (cycles per box): kz <= band and one above, at most nz/2 + 1. */
export function bandColumns(g: Grid3, band: number): number {
  const nh = halfLength(g.nz);
  return Number.isFinite(band) && band >= 0 ? Math.min(nh, Math.floor(band) + 2) : nh;
}

/** Length of the Float64Array of a band spectrum of grid g (see bandColumns). */
export function bandSpectrumLength(g: Grid3, band: number): number {
  return g.nx * g.ny * bandColumns(g, band) * 2;
}

/** kz columns held by spec (a half or band spectrum of g); throws RangeError if its length fits neither. */
export function spectrumColumns(spec: Float64Array, g: Grid3): number {
  const nc = spec.length / (2 * g.nx * g.ny);
  if (!Number.isInteger(nc) || nc < 1 || nc > halfLength(g.nz)) throw new RangeError(`spectrum of ${spec.length} values fits no half spectrum of ${g.nx}x${g.ny}x${g.nz}`);
  return nc;
}

/** Number of z lines (nx*ny) a z pass works on. */
export function zLineCount(g: Grid3): number {
  return g.nx * g.ny;
}

/** Number of lines a complex pass along axis 0 (x) or 1 (y) works on; `columns`: kz columns held (spectrumColumns). */
export function axisLineCount(g: Grid3, axis: 0 | 1, columns = halfLength(g.nz)): number {
  return axis === 0 ? g.ny * columns : g.nx * columns;
}

/** Throws RangeError unless a spectrum of nc columns holds what a pass with this band reads. */
function assertColumns(g: Grid3, nc: number, band: number): void {
  if (nc < halfLength(g.nz) && !(Math.floor(band) + 2 <= nc)) throw new RangeError(`a band spectrum of ${nc} kz columns needs a band hint below ${nc - 1}, got ${band}`);
}

/** Forward real transform of z lines [start, end) of `field` into the half spectrum `spec`. */
export function forwardZ(field: ArrayLike<number>, spec: Float64Array, g: Grid3, start = 0, end = zLineCount(g)): void {
  const { nz } = g;
  const nh = halfLength(nz);
  if (spectrumColumns(spec, g) !== nh) throw new RangeError('forwardZ needs a full half spectrum, not a band spectrum');
  const p = plan(nz);
  const input = new Float64Array(nz);
  const out = new Float64Array(2 * nz);
  const m = nh * 2;
  for (let line = start; line < end; line++) {
    const base = line * nz;
    for (let k = 0; k < nz; k++) input[k] = field[base + k]!;
    p.realTransform(out, input);
    spec.set(m === out.length ? out : out.subarray(0, m), line * m);
  }
}

/** Lines transformed at once by complexAxis: consecutive kz at one (j) or (i), stored side by side in the spectrum. */
const BLOCK = 16;

/** True when every value of line is +0 (not -0). */
function allPositiveZero(line: Float64Array): boolean {
  for (let q = 0; q < line.length; q++) if (line[q] !== 0 || 1 / line[q]! < 0) return false;
  return true;
}

/**
 * A known output line as complexAxis keeps it: null when it is +0 throughout (it equals what the
 * spectrum already holds there, +0 in, +0 out: nothing to write), else the line.
 */
function toWrite(out: Float64Array): Float64Array | null {
  return allPositiveZero(out) ? null : out;
}

/** Transform (plan p, direction inverse) of the line whose every complex value is (re, im). */
function constantLineTransform(p: FFT, n: number, inverse: boolean, re: number, im: number): Float64Array {
  const src = new Float64Array(2 * n);
  for (let a = 0; a < n; a++) { src[2 * a] = re; src[2 * a + 1] = im; }
  const dst = new Float64Array(2 * n);
  if (inverse) p.inverseTransform(dst, src);
  else p.transform(dst, src);
  return dst;
}

/**
 * Complex transform along axis 0 (x) or 1 (y) of lines [start, end) of the half spectrum, in place.
 * `band` (optional, cycles per box) promises that every mode with |ky| > band or kz > band is +0
 * before the axis-0 pass (as modes.ts leaves a band-limited spectrum). Then the axis-0 lines with
 * |ky| > band or kz > band, and the axis-1 lines with kz > band that such an axis-0 pass (same
 * direction, same band) produced, are not read: their known input is transformed once and
 * written (not even written when it is +0 throughout, as it is for fft.js: the spectrum already
 * holds +0 there). Same bytes as without the hint; pass it only when the promise holds. The lines
 * go through transformBatch (fft.js's operations, fft.js's bits) BLOCK at a time. `spec` may be a
 * band spectrum (see the file comment) when the band hint is given; `end` < 0: every line.
 */
export function complexAxis(spec: Float64Array, g: Grid3, axis: 0 | 1, inverse: boolean, start = 0, end = -1, band = Infinity): void {
  const { nx, ny } = g;
  // kz columns held (all nz/2 + 1, or fewer in a band spectrum)
  const nc = spectrumColumns(spec, g);
  assertColumns(g, nc, band);
  if (end < 0) end = axisLineCount(g, axis, nc);
  const n = axis === 0 ? nx : ny;
  const stride = axis === 0 ? ny * nc * 2 : nc * 2;
  const p = plan(n);
  // a block's lines sit side by side in the spectrum (consecutive kz): element a of line b at
  // base + a*stride + 2b, which is transformBatch's interleaved layout row by row
  const inB = new Float64Array(BLOCK * 2 * n);
  const outB = new Float64Array(BLOCK * 2 * n);
  // known lines (see `band`): axis 0 input all +0; axis 1 input constant, the x-transform of +0 at index i
  const hinted = band < Infinity;
  const zeroX = hinted ? constantLineTransform(plan(nx), nx, inverse, 0, 0) : null;
  const knownOut = hinted && axis === 0 ? toWrite(constantLineTransform(p, n, inverse, 0, 0)) : null;
  const knownByBits = new Map<string, Float64Array | null>();
  let line = start;
  while (line < end) {
    // line enumerates (j, kz) for axis 0 and (i, kz) for axis 1; a block shares j (or i)
    const outer = Math.floor(line / nc);
    const kz0 = line - outer * nc;
    const count = Math.min(BLOCK, end - line, nc - kz0);
    const base = axis === 0 ? (outer * nc + kz0) * 2 : (outer * ny * nc + kz0) * 2;
    // lines kz >= firstKnown of this block have a known input (count: none)
    let firstKnown = count;
    let known: Float64Array | null = null;
    if (hinted) {
      if (axis === 0 && Math.abs(signedWavenumber(outer, ny)) > band) firstKnown = 0;
      else firstKnown = Math.max(0, Math.min(count, Math.floor(band) + 1 - kz0));
      if (firstKnown < count) {
        if (axis === 0) known = knownOut;
        else {
          const re = zeroX![2 * outer]!, im = zeroX![2 * outer + 1]!;
          const key = `${re}:${im}:${Object.is(re, -0)}:${Object.is(im, -0)}`;
          if (!knownByBits.has(key)) knownByBits.set(key, toWrite(constantLineTransform(p, n, inverse, re, im)));
          known = knownByBits.get(key) ?? null;
        }
      }
    }
    const w = 2 * firstKnown;
    if (w > 0) {
      // +0 lines transform to +0 lines (fft.js does so): a block that is +0 throughout stays as it is
      let zero = true;
      for (let a = 0, o = base, t = 0; a < n; a++, o += stride) {
        for (let q = 0; q < w; q++, t++) {
          const v = spec[o + q]!;
          inB[t] = v;
          if (v !== 0 || 1 / v < 0) zero = false;
        }
      }
      if (!zero) {
        transformBatch(outB, inB, n, firstKnown, inverse);
        if (inverse) {
          // 1/n is exact (n a power of two): the same bits as dividing by n
          const scale = 1 / n;
          for (let a = 0, o = base, t = 0; a < n; a++, o += stride) for (let q = 0; q < w; q++, t++) spec[o + q] = outB[t]! * scale;
        } else {
          for (let a = 0, o = base, t = 0; a < n; a++, o += stride) for (let q = 0; q < w; q++, t++) spec[o + q] = outB[t]!;
        }
      }
    }
    // known lines with something to write (see toWrite)
    if (firstKnown < count && known !== null) {
      for (let a = 0, o = base; a < n; a++, o += stride) {
        for (let b = firstKnown; b < count; b++) {
          spec[o + 2 * b] = known[2 * a]!;
          spec[o + 2 * b + 1] = known[2 * a + 1]!;
        }
      }
    }
    line += count;
  }
}

/** Line pairs that inverseZ transforms together (transformBatch). */
const Z_BATCH = 8;

/**
 * Inverse real transform of z lines [start, end) of the half spectrum into `field`.
 * Two real lines are done with one complex transform (Z = A + iB gives a + ib), Z_BATCH pairs at a
 * time through transformBatch (fft.js's operations, so fft.js's bits), scaled by 1/nz where stored
 * (exact: nz is a power of two). `band` (cycles per box), when the axis passes ran with the same
 * band hint: every line then holds one value at all kz > band (the transform of the +0 modes), so
 * only kz <= band + 1 is read and that value is repeated (the same numbers as reading them all).
 */
export function inverseZ(spec: Float64Array, field: Float32Array | Float64Array, g: Grid3, start = 0, end = zLineCount(g), band = Infinity): void {
  const { nz } = g;
  const nh = halfLength(nz);
  // kz columns stored per line (a band spectrum holds fewer than nh)
  const nc = spectrumColumns(spec, g);
  assertColumns(g, nc, band);
  // kz <= last are read; kz in (last, nh) equal kz = last + 1 (when last + 1 < nh)
  const last = Math.min(nh - 1, Math.floor(band));
  const zb = new Float64Array(2 * nz * Z_BATCH);
  const ob = new Float64Array(2 * nz * Z_BATCH);
  const scale = 1 / nz;
  const pairs = Math.floor((end - start) / 2);
  for (let first = 0; first < pairs; first += Z_BATCH) {
    const P = Math.min(Z_BATCH, pairs - first);
    const P2 = 2 * P;
    for (let q = 0; q < P; q++) {
      const line = start + 2 * (first + q);
      const a = line * nc * 2;
      const b = (line + 1) * nc * 2;
      // Hermitian extension: X[k] = conj(X[nz - k]) for k > nz/2 (same operations as k < nh with sign -1)
      for (let k = 0; k <= last; k++) {
        const ar = spec[a + 2 * k]!;
        const ai = 1 * spec[a + 2 * k + 1]!;
        const br = spec[b + 2 * k]!;
        const bi = 1 * spec[b + 2 * k + 1]!;
        zb[k * P2 + 2 * q] = ar - bi;
        zb[k * P2 + 2 * q + 1] = ai + br;
      }
      // k in [nh, nz - last) reads src = nz - k > last: the repeated value too
      let hermFrom = nh;
      if (last + 1 < nh) {
        const c = 2 * (last + 1);
        const ar = spec[a + c]!, si = spec[a + c + 1]!, br = spec[b + c]!, ti = spec[b + c + 1]!;
        const ai = 1 * si, bi = 1 * ti;
        const pr = ar - bi, pi = ai + br;
        for (let k = last + 1; k < nh; k++) { zb[k * P2 + 2 * q] = pr; zb[k * P2 + 2 * q + 1] = pi; }
        const ni = -1 * si, nbi = -1 * ti;
        const mr = ar - nbi, mi = ni + br;
        hermFrom = nz - last;
        for (let k = nh; k < hermFrom; k++) { zb[k * P2 + 2 * q] = mr; zb[k * P2 + 2 * q + 1] = mi; }
      }
      for (let k = hermFrom; k < nz; k++) {
        const src = nz - k;
        const ar = spec[a + 2 * src]!;
        const ai = -1 * spec[a + 2 * src + 1]!;
        const br = spec[b + 2 * src]!;
        const bi = -1 * spec[b + 2 * src + 1]!;
        zb[k * P2 + 2 * q] = ar - bi;
        zb[k * P2 + 2 * q + 1] = ai + br;
      }
    }
    transformBatch(ob, zb, nz, P, true);
    for (let q = 0; q < P; q++) {
      const fa = (start + 2 * (first + q)) * nz;
      const fb = fa + nz;
      for (let k = 0, o = 2 * q; k < nz; k++, o += P2) {
        field[fa + k] = ob[o]! * scale;
        field[fb + k] = ob[o + 1]! * scale;
      }
    }
  }
  if ((end - start) % 2 === 1) {
    // the last line has no partner: Z = A alone (the same operations as a pair with B = 0)
    const line = end - 1;
    const a = line * nc * 2;
    const p = plan(nz);
    const z = new Float64Array(2 * nz);
    const out = new Float64Array(2 * nz);
    for (let k = 0; k < nz; k++) {
      const src = k < nh ? k : nz - k;
      const sgn = k < nh ? 1 : -1;
      // columns above last hold the value of column last + 1 (band hint)
      const col = src > last ? last + 1 : src;
      const ar = spec[a + 2 * col]!;
      const ai = sgn * spec[a + 2 * col + 1]!;
      z[2 * k] = ar - 0;
      z[2 * k + 1] = ai + 0;
    }
    p.inverseTransform(out, z);
    const fa = line * nz;
    for (let k = 0; k < nz; k++) field[fa + k] = out[2 * k]!;
  }
}

/** Forward real 3D FFT of a field, returning (or filling) its half spectrum; single thread. */
export function realForward3(field: ArrayLike<number>, g: Grid3, spec: Float64Array = new Float64Array(halfSpectrumLength(g))): Float64Array {
  assertFftShape(g);
  forwardZ(field, spec, g);
  complexAxis(spec, g, 1, false, 0, axisLineCount(g, 1));
  complexAxis(spec, g, 0, false, 0, axisLineCount(g, 0));
  return spec;
}

/**
 * Inverse real 3D FFT of a half spectrum into `field` (normalised by N); overwrites `spec`; single
 * thread. `band` (cycles per box): every mode with |ky| or kz above it is +0 (see complexAxis).
 */
export function realInverse3(spec: Float64Array, g: Grid3, field: Float32Array | Float64Array, band = Infinity): void {
  assertFftShape(g);
  const nc = spectrumColumns(spec, g);
  complexAxis(spec, g, 0, true, 0, axisLineCount(g, 0, nc), band);
  complexAxis(spec, g, 1, true, 0, axisLineCount(g, 1, nc), band);
  inverseZ(spec, field, g, 0, zLineCount(g), band);
}
