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

/** The Eos for settings as a config states them: kind, critical_density (g/cm^3) and gamma (used when barotropic). */
export function eosFromSettings(s: { readonly kind: 'isothermal' | 'barotropic'; readonly critical_density: number; readonly gamma: number }): Eos {
  return s.kind === 'isothermal' ? { kind: 'isothermal' } : { kind: 'barotropic', criticalDensity: s.critical_density, gamma: s.gamma };
}

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

/** Scratch views for reading a Float32's neighbours through its bits. */
const F32 = new Float32Array(1);
const U32 = new Uint32Array(F32.buffer);

/**
 * Relative margin of the fast power in eosTemperatureFloat32: exp(a) with a = (gamma - 1) ln x,
 * |a| < FAST_POW_ARGUMENT, differs from Math.pow(x, gamma - 1) by about |a| x 3e-16 + 2e-16
 * (< 1.5e-14) relative (each of log, the product and exp rounds to within an ulp); the margin
 * leaves a factor ~70 on top.
 */
const FAST_POW_MARGIN = 1e-12;
const FAST_POW_ARGUMENT = 40;

/**
 * Float32 temperature, K, at density rho (g/cm^3) from base temperature t0 (K): the value of
 * Math.fround(eosTemperature(eos, t0, rho)), bit for bit, but faster. The power x^(gamma-1) is
 * taken as exp((gamma-1) ln x); only when the resulting temperature lies within FAST_POW_MARGIN
 * (relative) of a rounding boundary between two Float32 values (about 1 cell in 10^5) is the exact
 * power used, so both ways round to the same Float32.
 */
export function eosTemperatureFloat32(eos: Eos, t0: number, rho: number): number {
  if (eos.kind === 'isothermal') return Math.fround(eosTemperature(eos, t0, rho));
  const x = rho / eos.criticalDensity;
  const a = (eos.gamma - 1) * Math.log(x);
  if (!(x > 0) || !(Math.abs(a) < FAST_POW_ARGUMENT) || !(t0 > 0)) return Math.fround(eosTemperature(eos, t0, rho));
  const t = t0 * (1 + Math.exp(a));
  const f = Math.fround(t);
  F32[0] = f;
  const bits = U32[0]!;
  // f positive, finite and normal, so its Float32 neighbours are the next bit patterns
  if (bits < 0x00800000 || bits >= 0x7f7fffff) return Math.fround(eosTemperature(eos, t0, rho));
  U32[0] = bits + 1;
  const up = F32[0]!;
  U32[0] = bits - 1;
  const down = F32[0]!;
  // the midpoints (f + neighbour)/2 are exact in Float64; t must stay clear of both
  const m = FAST_POW_MARGIN * t;
  if (t - (f + down) / 2 > m && (f + up) / 2 - t > m) return f;
  return Math.fround(eosTemperature(eos, t0, rho));
}
