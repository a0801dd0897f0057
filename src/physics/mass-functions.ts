/**
 * Stellar initial mass functions and a turbulent-fragmentation core mass function.
 *
 * Every function returns dN/dlog10(m) up to a constant (shapes; callers normalise), for a
 * mass m in solar masses (IMFs) or in units of a reference mass (the core model). Slopes are
 * quoted for dN/dm ~ m^-slope, so Salpeter's is 2.35 (dN/dlog m ~ m^-1.35).
 *
 * - Salpeter (1955): dN/dm ~ m^-2.35.
 * - Kroupa (2001), eq. 2: dN/dm ~ m^-0.3 (0.01-0.08 Msun), m^-1.3 (0.08-0.5), m^-2.3 (> 0.5),
 *   continuous at the breaks.
 * - Chabrier (2003), Table 1: single-star form dN/dlog m = 0.158 exp(-(log m - log 0.079)^2 /
 *   (2 0.69^2)) for m <= 1 Msun; system form 0.086 exp(-(log m - log 0.22)^2 / (2 0.57^2));
 *   both continue as A m^-1.3 (dN/dlog m) above 1 Msun, with A fixed here by continuity at
 *   1 Msun (Chabrier's tabulated 4.43e-2 for the single form agrees within a few per cent;
 *   coefficients from memory).
 * - Padoan & Nordlund (2002), eq. 24-25: cores formed by shocks in supersonic turbulence have
 *   dN/dln m ~ m^(-3/(4 - beta)) times the fraction of them that exceed their local Jeans
 *   mass, with beta the index of the velocity energy spectrum E(k) ~ k^-beta. With a
 *   lognormal (mass-weighted) density PDF of width sigma, that fraction is
 *   (1/2)[1 + erf((4 ln m + sigma^2) / (2 sqrt 2 sigma))], m in units of the Jeans mass at the
 *   mean density. So the high-mass slope in dN/dlog m is 3/(4 - beta) (in dN/dm: 1 + 3/(4 - beta)).
 *   A 3D power spectrum P(k) ~ k^-n has E(k) = 4 pi k^2 P(k) ~ k^-(n-2), so beta = n - 2.
 */
import { lognormalWidth } from './turbulence.js';

/** Salpeter (1955) slope of dN/dm, dimensionless. */
export const SALPETER_SLOPE = 2.35;

/** Error function, |error| < 1.5e-7 (Abramowitz & Stegun 1964, 7.1.26). */
export function erf(x: number): number {
  const s = x < 0 ? -1 : 1;
  const a = Math.abs(x);
  const t = 1 / (1 + 0.3275911 * a);
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-a * a);
  return s * y;
}

/** Salpeter (1955) IMF, dN/dlog10 m (arbitrary normalisation), m in Msun. */
export function salpeterImf(m: number): number {
  return m ** (1 - SALPETER_SLOPE);
}

/** Kroupa (2001) three-segment IMF, dN/dlog10 m (arbitrary normalisation), m in Msun (zero below 0.01). */
export function kroupaImf(m: number): number {
  if (m < 0.01) return 0;
  // dN/dm segments continuous at 0.08 and 0.5 Msun; dN/dlog m = m dN/dm
  let dndm: number;
  if (m < 0.08) dndm = (m / 0.08) ** -0.3;
  else if (m < 0.5) dndm = (m / 0.08) ** -1.3;
  else dndm = (0.5 / 0.08) ** -1.3 * (m / 0.5) ** -2.3;
  return m * dndm;
}

/** Chabrier (2003) IMF, dN/dlog10 m per pc^-3 scale, m in Msun; form 'single' (individual stars) or 'system' (unresolved systems). */
export function chabrierImf(m: number, form: 'single' | 'system' = 'single'): number {
  const [a, mc, sig] = form === 'single' ? [0.158, 0.079, 0.69] : [0.086, 0.22, 0.57];
  const logNormal = (x: number): number => a * Math.exp(-((Math.log10(x) - Math.log10(mc)) ** 2) / (2 * sig * sig));
  if (m <= 1) return logNormal(m);
  return logNormal(1) * m ** -1.3;
}

/** Padoan & Nordlund (2002) high-mass slope of dN/dlog m, 3/(4 - beta), for energy-spectrum index beta. */
export function padoanNordlundSlope(beta: number): number {
  if (!(beta < 4)) throw new RangeError(`velocity energy-spectrum index beta must be below 4, got ${beta}`);
  return 3 / (4 - beta);
}

/** Energy-spectrum index beta = n - 2 for a 3D velocity power spectrum P(k) ~ k^-n. */
export function energySpectrumIndex(powerSpectrumIndex: number): number {
  return powerSpectrumIndex - 2;
}

/** Forcing parameter Padoan & Nordlund (2002) used for the density PDF width, sigma^2 = ln(1 + Mach^2/4). */
export const PADOAN_NORDLUND_B = 0.5;

/**
 * Padoan & Nordlund (2002) core mass function, dN/dlog10 m (arbitrary normalisation), for m in
 * units of the Jeans mass at the mean density, rms Mach number `mach` and energy-spectrum index
 * `beta`; density-PDF width from sigma^2 = ln(1 + b^2 Mach^2) with b = 1/2 as in their paper.
 */
export function padoanNordlundCmf(m: number, mach: number, beta: number, b = PADOAN_NORDLUND_B): number {
  const x = padoanNordlundSlope(beta);
  const sigma = lognormalWidth(b, mach);
  const unstable = sigma > 0 ? 0.5 * (1 + erf((4 * Math.log(m) + sigma * sigma) / (2 * Math.SQRT2 * sigma))) : m >= 1 ? 1 : 0;
  return m ** -x * unstable;
}
