/**
 * Specific internal energy of an ideal gas, cgs.
 *
 * u = k_B T / ((gamma - 1) mu m_H); for a monatomic-like gamma = 5/3 this is (3/2) k_B T/(mu m_H)
 * (common practice for the thermal energy handed to hydro and particle codes at low temperature,
 * where the rotational levels of H2 are not excited).
 */
import { soundSpeed } from './sound-speed.js';

/** Adiabatic index used for the exported internal energy (common practice below ~100 K). */
export const INTERNAL_ENERGY_GAMMA = 5 / 3;

/** Specific internal energy per kelvin, erg g^-1 K^-1: c_s^2(T = 1 K) / (gamma - 1) for mean molecular weight mu. */
export function internalEnergyPerKelvin(mu: number, gamma = INTERNAL_ENERGY_GAMMA): number {
  const c1 = soundSpeed(1, mu);
  return (c1 * c1) / (gamma - 1);
}
