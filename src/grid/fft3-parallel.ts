/**
 * The real 3D FFT of fft3.ts run over a WorkerPool. Fields and spectra must be backed by
 * SharedArrayBuffer. Each pass splits its lines between workers; results are identical to the
 * single-thread transform because every line is transformed by the same code.
 */
import type { Grid3 } from './grid3.js';
import type { WorkerPool } from './pool.js';
import { assertFftShape, axisLineCount, bandSpectrumLength, halfSpectrumLength, realForward3, realInverse3, spectrumColumns, zLineCount } from './fft3.js';

/** A zeroed half spectrum on shared memory (Float64Array, interleaved complex); a band spectrum (fft3.ts) when `band` (cycles per box) is given. */
export function sharedSpectrum(g: Grid3, band = Infinity): Float64Array {
  return new Float64Array(new SharedArrayBuffer((Number.isFinite(band) ? bandSpectrumLength(g, band) : halfSpectrumLength(g)) * 8));
}

/** Forward real 3D FFT of a field into spec, over the pool (single thread when pool is null). */
export async function realForward3Parallel(pool: WorkerPool | null, field: Float32Array, g: Grid3, spec: Float64Array): Promise<Float64Array> {
  if (!pool || pool.size < 2) return realForward3(field, g, spec);
  assertFftShape(g);
  await pool.runRanges('fftForwardZ', zLineCount(g), [field, spec, g]);
  await pool.runRanges('fftAxis', axisLineCount(g, 1), [spec, g, 1, false]);
  await pool.runRanges('fftAxis', axisLineCount(g, 0), [spec, g, 0, false]);
  return spec;
}

/**
 * Inverse real 3D FFT of spec into field (normalised; overwrites spec), over the pool.
 * `band` (cycles per box): every mode with |ky| or kz above it is +0 (see complexAxis in fft3.ts);
 * spec may then be a band spectrum.
 */
export async function realInverse3Parallel(pool: WorkerPool | null, spec: Float64Array, g: Grid3, field: Float32Array, band = Infinity): Promise<void> {
  if (!pool || pool.size < 2) return realInverse3(spec, g, field, band);
  assertFftShape(g);
  const nc = spectrumColumns(spec, g);
  await pool.runRanges('fftAxisBand', axisLineCount(g, 0, nc), [spec, g, 0, true, band]);
  await pool.runRanges('fftAxisBand', axisLineCount(g, 1, nc), [spec, g, 1, true, band]);
  // inverseZ pairs lines; keep ranges even-aligned so pairing (and bytes) match the single-thread run
  const n = zLineCount(g);
  const half = Math.floor(n / 2 / pool.size) * 2;
  const ranges: Array<[number, number]> = [];
  for (let p = 0, a = 0; p < pool.size; p++) {
    const b = p === pool.size - 1 ? n : a + half;
    if (b > a) ranges.push([a, b]);
    a = b;
  }
  await Promise.all(ranges.map(([a, b]) => pool.run('fftInverseZ', [a, b, spec, field, g, band])));
}
