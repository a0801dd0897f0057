/**
 * Warm-up of a plan's worker threads. Each thread compiles its own copy of the hot functions, and
 * V8 runs a function unoptimised (boxing every double) until it has seen enough of it; the first
 * real call on a 256^3 grid then pays for that (the inverse z pass: 189 ms first, 96 ms after,
 * measured). The pool's threads, which would otherwise wait while the CLI loads the config, therefore
 * first run the 3D transforms on a small made-up grid (about 50 ms). The made-up data are thrown
 * away; the functions are pure, so results do not change (the same bytes either way). Measured at
 * 256^3 (A/B, 10 runs each): plan 3.10 vs 3.22 s, CPU 5.70 vs 5.96 s. (Warming the merge tree on
 * its thread as well measured slower.)
 */
import { bandSpectrumLength, realForward3, realInverse3 } from './grid/fft3.js';

/** Which functions a thread warms up: the pool's 3D transforms. */
export type WarmUp = 'transforms';

/** Cells per side of the made-up grid. */
const SIDE = 32;

/** Runs the band-limited inverse and the forward 3D transform (shared Float32 field; and a Float64 one) a few times on a SIDE^3 grid. */
export function warmUpTransforms(rounds = 3): void {
  const g = { nx: SIDE, ny: SIDE, nz: SIDE, boxSize: 1 };
  const band = SIDE / 4;
  for (let r = 0; r < rounds; r++) {
    const spec = new Float64Array(new SharedArrayBuffer(bandSpectrumLength(g, band) * 8));
    for (let i = 0; i < spec.length; i++) spec[i] = Math.sin(i + r);
    const field = new Float32Array(new SharedArrayBuffer(4 * SIDE ** 3));
    realInverse3(spec, g, field, band);
    realForward3(field, g);
    // the self-gravity transforms double-precision grids: the forward pass sees both array types
    // (once, before V8 optimises it)
    if (r === 0) realForward3(Float64Array.from(field), g);
  }
}

/** Runs the warm-up for `kind` (nothing for undefined). */
export function warmUp(kind: WarmUp | undefined): void {
  if (kind === 'transforms') warmUpTransforms();
}
