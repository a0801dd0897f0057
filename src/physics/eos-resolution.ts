/**
 * Resolution criteria judged at the temperature the gas has at each density, cgs.
 *
 * With the barotropic EOS of eos.ts, c_s^2(rho) = c_s0^2 f(rho), f = 1 + (rho/rho_c)^(gamma-1)
 * (common practice form after Masunaga & Inutsuka 2000). Criteria of the form
 * rho = pi c_s(rho)^2 / (G L^2) (Truelove et al. 1997 with L = N_J dx; Federrath et al. 2010
 * with L = 2 r_acc) then read rho = a f(rho), solved here self-consistently. The Jeans mass
 * M_J ~ c_s^3 rho^(-1/2) has a minimum when gamma > 4/3; densityForJeansMassEos returns the
 * first (lowest) density at which M_J falls to the given mass, or Infinity if it never does.
 */
import { eosSoundSpeed, eosTemperatureFactor, type Eos } from './eos.js';
import { jeansMass, densityForJeansMass, type JeansConvention } from './jeans.js';
import { maxResolvedDensity, sinkThresholdDensity } from './resolution.js';

/** Solves rho = a f(rho) for the density, g/cm^3, given a (g/cm^3, the isothermal value); Infinity if no solution (gamma >= 2). */
export function solveDensityWithEos(a: number, eos: Eos): number {
  if (!(a > 0)) return a === 0 ? 0 : NaN;
  if (eos.kind === 'isothermal') return a;
  const g = (rho: number): number => rho - a * eosTemperatureFactor(eos, rho);
  let lo = a; // g(a) < 0
  let hi = 2 * a;
  let n = 0;
  while (g(hi) <= 0) {
    lo = hi;
    hi *= 4;
    if (++n > 600 || !Number.isFinite(hi)) return Infinity;
  }
  for (let i = 0; i < 200 && hi / lo > 1 + 1e-15; i++) {
    const mid = Math.sqrt(lo * hi);
    if (g(mid) > 0) hi = mid;
    else lo = mid;
  }
  return Math.sqrt(lo * hi);
}

/** Max density, g/cm^3, resolved with N_J cells of size dx (cm) per Jeans length, at the EOS sound speed there (Truelove et al. 1997). */
export function maxResolvedDensityEos(cs0: number, dx: number, cellsPerJeansLength: number, eos: Eos): number {
  return solveDensityWithEos(maxResolvedDensity(cs0, dx, cellsPerJeansLength), eos);
}

/** Sink threshold density, g/cm^3, pi c_s(rho)^2/(4 G r_acc^2) solved at the EOS sound speed (Federrath et al. 2010); r_acc in cm. */
export function sinkThresholdDensityEos(cs0: number, accretionRadius: number, eos: Eos): number {
  return solveDensityWithEos(sinkThresholdDensity(cs0, accretionRadius), eos);
}

/** Jeans mass, g, at density rho (g/cm^3) with the EOS sound speed (base sound speed cs0 in cm/s). */
export function jeansMassEos(cs0: number, rho: number, eos: Eos, convention: JeansConvention = 'sphere'): number {
  return jeansMass(eosSoundSpeed(eos, cs0, rho), rho, convention);
}

/** Density, g/cm^3, where the EOS Jeans mass is smallest (Infinity when it only falls: isothermal or gamma <= 4/3). */
export function minimumJeansMassDensity(eos: Eos): number {
  if (eos.kind === 'isothermal') return Infinity;
  // d ln M_J / d ln rho = -1/2 + (3/2)(gamma-1) x/(1+x), x = (rho/rho_c)^(gamma-1): zero at x = 1/(3(gamma-1) - 1).
  const q = 3 * (eos.gamma - 1) - 1;
  if (q <= 0) return Infinity;
  return eos.criticalDensity * (1 / q) ** (1 / (eos.gamma - 1));
}

/** Lowest density, g/cm^3, at which the EOS Jeans mass falls to `mass` (g); Infinity if it never does. */
export function densityForJeansMassEos(cs0: number, mass: number, eos: Eos, convention: JeansConvention = 'sphere'): number {
  const iso = densityForJeansMass(cs0, mass, convention);
  if (eos.kind === 'isothermal') return iso;
  const h = (rho: number): number => Math.log(jeansMassEos(cs0, rho, eos, convention) / mass);
  const rhoMin = minimumJeansMassDensity(eos);
  let lo = iso; // M_J,eos(iso) >= mass
  let hi: number;
  if (Number.isFinite(rhoMin)) {
    if (h(rhoMin) > 0) return Infinity;
    if (rhoMin <= lo) return lo;
    hi = rhoMin;
  } else {
    hi = 2 * lo;
    let n = 0;
    while (h(hi) > 0) {
      lo = hi;
      hi *= 4;
      if (++n > 600 || !Number.isFinite(hi)) return Infinity;
    }
  }
  if (h(lo) <= 0) return lo;
  for (let i = 0; i < 200 && hi / lo > 1 + 1e-15; i++) {
    const mid = Math.sqrt(lo * hi);
    if (h(mid) > 0) lo = mid;
    else hi = mid;
  }
  return Math.sqrt(lo * hi);
}
