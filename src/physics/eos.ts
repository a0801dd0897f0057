/**
 * Equation of state: isothermal, or barotropic stiffening at high density.
 *
 * Barotropic form (common practice in collapse simulations, following the radiation-
 * hydrodynamic results of Masunaga & Inutsuka 2000):
 *   T(rho) = T0 [1 + (rho / rho_c)^(gamma - 1)],  gamma = 7/5, rho_c ~ 1e-13 g cm^-3,
 * so c_s^2(rho) = c_s0^2 [1 + (rho/rho_c)^(gamma-1)]. Below rho_c the gas is isothermal.
 */

/** Equation of state: isothermal, or barotropic with critical density (g/cm^3) and gamma. */
export type Eos =
  | { readonly kind: 'isothermal' }
  | { readonly kind: 'barotropic'; readonly criticalDensity: number; readonly gamma: number };

/** Masunaga & Inutsuka (2000) stiffening density, g/cm^3 (value from memory of common use). */
export const BAROTROPIC_CRITICAL_DENSITY = 1e-13;
/** Adiabatic index of molecular hydrogen above the stiffening density (common practice). */
export const BAROTROPIC_GAMMA = 7 / 5;

/** Temperature factor T(rho)/T0, dimensionless, for density rho (g/cm^3). */
export function eosTemperatureFactor(eos: Eos, rho: number): number {
  if (eos.kind === 'isothermal') return 1;
  return 1 + (rho / eos.criticalDensity) ** (eos.gamma - 1);
}

/** Temperature, K, of gas at density rho (g/cm^3) with base temperature t0 (K). */
export function eosTemperature(eos: Eos, t0: number, rho: number): number {
  return t0 * eosTemperatureFactor(eos, rho);
}

/** Sound speed, cm/s, at density rho (g/cm^3) with base isothermal sound speed cs0 (cm/s). */
export function eosSoundSpeed(eos: Eos, cs0: number, rho: number): number {
  return cs0 * Math.sqrt(eosTemperatureFactor(eos, rho));
}
