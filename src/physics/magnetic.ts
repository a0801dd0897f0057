/**
 * Magnetic quantities, cgs (gauss).
 *
 * Critical mass-to-flux ratio (M/Phi)_crit = 1/(2 pi sqrt(G)) (Nakano & Nakamura 1978).
 * Magnetic energy E_mag = B^2 V / (8 pi); Alfven speed v_A = B / sqrt(4 pi rho);
 * plasma beta = 8 pi P / B^2 with P = rho c_s^2.
 */
import { G } from './constants.js';

/** Critical mass-to-flux ratio 1/(2 pi sqrt(G)), g G^-1 cm^-2 (Nakano & Nakamura 1978). */
export function criticalMassToFlux(): number {
  return 1 / (2 * Math.PI * Math.sqrt(G.value));
}

/** Field strength, G, that gives mass-to-flux ratio mu (in units of the critical value) for mass M (g) through area A (cm^2). */
export function fieldForMassToFlux(muRelative: number, mass: number, area: number): number {
  return mass / (muRelative * criticalMassToFlux() * area);
}

/** Mass-to-flux ratio relative to critical, dimensionless, for mass M (g), field B (G), area A (cm^2). */
export function massToFluxRelative(mass: number, field: number, area: number): number {
  return mass / (field * area) / criticalMassToFlux();
}

/** Magnetic energy B^2 V / (8 pi), erg, for field B (G) and volume V (cm^3). */
export function magneticEnergy(field: number, volume: number): number {
  return (field * field * volume) / (8 * Math.PI);
}

/** Alfven speed B / sqrt(4 pi rho), cm/s. */
export function alfvenSpeed(field: number, rho: number): number {
  return field / Math.sqrt(4 * Math.PI * rho);
}

/** Plasma beta 8 pi rho c_s^2 / B^2, dimensionless (infinite for B = 0). */
export function plasmaBeta(rho: number, cs: number, field: number): number {
  return field === 0 ? Infinity : (8 * Math.PI * rho * cs * cs) / (field * field);
}
