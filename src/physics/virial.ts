/**
 * Energies and virial ratios of a cloud, cgs.
 *
 * alpha_vir = 5 sigma_1D^2 R / (G M) (Bertoldi & McKee 1992). Thermal alpha = E_th/|W| and
 * rotational beta = E_rot/|W| as used for collapse tests (e.g. Boss & Bodenheimer 1979).
 */
import { G } from './constants.js';

/** Virial parameter alpha_vir = 5 sigma_1D^2 R / (G M), dimensionless; sigma in cm/s, R in cm, M in g. */
export function virialParameter(sigma1D: number, radius: number, mass: number): number {
  return (5 * sigma1D * sigma1D * radius) / (G.value * mass);
}

/** One-dimensional velocity dispersion, cm/s, that gives virial parameter alpha for mass M (g) and radius R (cm). */
export function sigmaForVirialParameter(alpha: number, radius: number, mass: number): number {
  return Math.sqrt((alpha * G.value * mass) / (5 * radius));
}

/** Gravitational energy of a uniform sphere, -(3/5) G M^2 / R, erg. */
export function uniformSphereGravitationalEnergy(mass: number, radius: number): number {
  return (-3 / 5) * G.value * mass * mass / radius;
}

/** Thermal energy of isothermal gas, (3/2) N k_B T = (3/2) M c_s^2, erg, for mass (g) and sound speed (cm/s). */
export function thermalEnergy(mass: number, cs: number): number {
  return 1.5 * mass * cs * cs;
}

/** Rotational energy of a uniform sphere in solid-body rotation, (1/5) M R^2 Omega^2, erg. */
export function uniformSphereRotationalEnergy(mass: number, radius: number, omega: number): number {
  return 0.2 * mass * radius * radius * omega * omega;
}

/** Ratio of an energy to the magnitude of the gravitational energy, dimensionless (alpha or beta). */
export function energyRatio(energy: number, gravitationalEnergy: number): number {
  return energy / Math.abs(gravitationalEnergy);
}
