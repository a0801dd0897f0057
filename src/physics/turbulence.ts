/**
 * Statistics of supersonic isothermal turbulence.
 *
 * Density PDF lognormal in s = ln(rho/rho0) with sigma_s^2 = ln(1 + b^2 M^2)
 * (Padoan, Nordlund & Jones 1997; Federrath, Klessen & Schmidt 2008), b = 1/3 for purely
 * solenoidal and 1 for purely compressive driving. Mass-weighted mean of s is +sigma_s^2/2,
 * volume-weighted mean is -sigma_s^2/2, so that <rho>_V = rho0.
 * Federrath et al. (2010) give the compressive power fraction of a Helmholtz-projected
 * field with weight zeta (1 solenoidal, 0 compressive) in 3D as
 *   chi = (1 - zeta)^2 / (1 - 2 zeta + 3 zeta^2).
 * Larson (1981): sigma_1D ~ 1.1 km/s (L/pc)^0.38.
 */

/** Width sigma_s of the lognormal density PDF, dimensionless, for forcing parameter b and rms Mach number. */
export function lognormalWidth(b: number, mach: number): number {
  return Math.sqrt(Math.log(1 + b * b * mach * mach));
}

/** Compressive fraction of the velocity power for Helmholtz weight zeta in 3D (Federrath et al. 2010). */
export function compressiveFraction(zeta: number): number {
  return (1 - zeta) ** 2 / (1 - 2 * zeta + 3 * zeta * zeta);
}

/** Forcing parameter b for a Helmholtz weight zeta, interpolating 1/3 (zeta=1) to 1 (zeta=0) (Federrath et al. 2010 fit, approximate). */
export function forcingParameterForWeight(zeta: number): number {
  return 1 + (1 / 3 - 1) * zeta;
}

/** Larson (1981) linewidth-size relation sigma_1D = 1.10 km/s (L/pc)^0.38, cm/s, for size L in pc. */
export function larsonDispersion(sizePc: number): number {
  return 1.1e5 * sizePc ** 0.38;
}
