/**
 * The volume-weighted lognormal density PDF of supersonic turbulence (Vazquez-Semadeni 1994;
 * Padoan, Nordlund & Jones 1997): s = ln(rho/rho0) is Gaussian with width sigma_s and mean
 * -sigma_s^2/2, so the mean density is rho0. Dimensionless.
 */

/** Complementary error function erfc(x), dimensionless; Chebyshev fit, fractional error < 1.2e-7 (Press et al., Numerical Recipes, erfcc). */
export function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const r = t * Math.exp(-z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418 +
    t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 +
    t * (-0.82215223 + t * 0.17087277)))))))));
  return x >= 0 ? r : 2 - r;
}

/** Volume fraction, dimensionless, of gas denser than `ratio` times the mean for a lognormal PDF of width sigmaS. */
export function lognormalVolumeFractionAbove(ratio: number, sigmaS: number): number {
  if (!(ratio > 0)) return 1;
  if (!(sigmaS > 0)) return ratio < 1 ? 1 : 0;
  const s = Math.log(ratio);
  const mean = -0.5 * sigmaS * sigmaS;
  return 0.5 * erfc((s - mean) / (sigmaS * Math.SQRT2));
}

/** Mass fraction, dimensionless, of gas denser than `ratio` times the mean (mass-weighted PDF has mean +sigma_s^2/2). */
export function lognormalMassFractionAbove(ratio: number, sigmaS: number): number {
  if (!(ratio > 0)) return 1;
  if (!(sigmaS > 0)) return ratio < 1 ? 1 : 0;
  const s = Math.log(ratio);
  const mean = 0.5 * sigmaS * sigmaS;
  return 0.5 * erfc((s - mean) / (sigmaS * Math.SQRT2));
}
