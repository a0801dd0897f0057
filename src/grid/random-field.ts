/**
 * Seeded Gaussian random fields, drawn per wavevector so that they are phase-consistent
 * across resolution.
 *
 * Each Fourier mode with signed integer wavevector (kx, ky, kz) gets its complex Gaussian
 * amplitude from a hash of (seed key, stream, kx, ky, kz) alone, never from a running
 * random sequence. The same seed therefore gives the same large-scale modes at 64^3, 128^3
 * and 256^3, and a coarse grid holds exactly the modes of a fine one that it can represent.
 * The seed key comes from seedrandom (ARC4 keyed by the seed's decimal string).
 * Hermitian symmetry: modes live in the half spectrum (kz >= 0); on the kz = 0 plane the
 * mode of (-kx, -ky, 0) is the conjugate of (kx, ky, 0). The k = 0 mode and every mode with
 * a component at the Nyquist index are set to zero.
 * Layout as in fft3.ts: half spectrum (nx, ny, nz/2 + 1), interleaved complex.
 */
import seedrandom from 'seedrandom';
import type { Grid3 } from './grid3.js';
import { halfLength, halfSpectrumLength, signedWavenumber } from './fft3.js';

/** 32-bit integer hash (good avalanche; public-domain "lowbias32" constants). */
export function hash32(x: number): number {
  x = x >>> 0;
  x ^= x >>> 16;
  x = Math.imul(x, 0x7feb352d);
  x ^= x >>> 15;
  x = Math.imul(x, 0x846ca68b);
  x ^= x >>> 16;
  return x >>> 0;
}

/** A 32-bit key derived from an integer seed with seedrandom. */
export function seedKey(seed: number): number {
  return seedrandom(String(seed)).int32() >>> 0;
}

/** Hash of (key, stream, kx, ky, kz) as a 32-bit integer; wavenumbers must lie in [-32768, 32767]. */
export function modeHash(key: number, stream: number, kx: number, ky: number, kz: number): number {
  let h = hash32(key ^ Math.imul(stream + 1, 0x9e3779b9));
  h = hash32(h ^ (((kx & 0xffff) << 16) | (ky & 0xffff)));
  h = hash32(h ^ Math.imul((kz & 0xffff) + 1, 0x85ebca6b));
  return h;
}

/** Standard complex Gaussian (each part unit variance) for a mode, written to out[0], out[1]. */
export function modeGaussian(key: number, stream: number, kx: number, ky: number, kz: number, out: Float64Array): void {
  const h = modeHash(key, stream, kx, ky, kz);
  const u1 = (hash32(h ^ 0x68bc21eb) + 0.5) / 4294967296;
  const u2 = (hash32(h ^ 0x02e5be93) + 0.5) / 4294967296;
  const r = Math.sqrt(-2 * Math.log(u1));
  out[0] = r * Math.cos(2 * Math.PI * u2);
  out[1] = r * Math.sin(2 * Math.PI * u2);
}

/**
 * Fills a half spectrum with Gaussian modes of mean power <|F(k)|^2> = power(|k|), |k| in
 * integer wavenumber units (cycles per box). Returns the spectrum.
 * Example: gaussianModes(g, 42, 0, k => k > 0 ? k ** -4 : 0) for a Burgers-like velocity component.
 */
export function gaussianModes(
  g: Grid3,
  seed: number,
  stream: number,
  power: (k: number) => number,
  spec: Float64Array = new Float64Array(halfSpectrumLength(g)),
): Float64Array {
  const key = seedKey(seed);
  const { nx, ny, nz } = g;
  const nh = halfLength(nz);
  const z = new Float64Array(2);
  for (let i = 0; i < nx; i++) {
    const kx = signedWavenumber(i, nx);
    for (let j = 0; j < ny; j++) {
      const ky = signedWavenumber(j, ny);
      for (let c = 0; c < nh; c++) {
        const idx = ((i * ny + j) * nh + c) * 2;
        const kz = c;
        const nyq = 2 * Math.abs(kx) === nx || 2 * Math.abs(ky) === ny || 2 * kz === nz;
        const k = Math.sqrt(kx * kx + ky * ky + kz * kz);
        if (nyq || k === 0) {
          spec[idx] = 0;
          spec[idx + 1] = 0;
          continue;
        }
        const p = power(k);
        if (!(p > 0)) {
          spec[idx] = 0;
          spec[idx + 1] = 0;
          continue;
        }
        // canonical representative on the kz = 0 plane
        let flip = false;
        let ax = kx, ay = ky;
        if (kz === 0 && (ky < 0 || (ky === 0 && kx < 0))) {
          flip = true;
          ax = -kx;
          ay = -ky;
        }
        modeGaussian(key, stream, ax, ay, kz, z);
        const amp = Math.sqrt(p / 2);
        spec[idx] = amp * z[0]!;
        spec[idx + 1] = (flip ? -1 : 1) * amp * z[1]!;
      }
    }
  }
  return spec;
}
