/**
 * Jeans length and the three Jeans-mass conventions, cgs.
 *
 * lambda_J = sqrt(pi c_s^2 / (G rho)) (Jeans 1902; the form used by Truelove et al. 1997).
 * Conventions for the Jeans mass (always reported with the name):
 * - "sphere": mass of a sphere of diameter lambda_J, (pi^(5/2)/6) c_s^3 G^(-3/2) rho^(-1/2);
 * - "cube": rho lambda_J^3;
 * - "virial": uniform sphere at the edge of 2K + W = 0 with K = (3/2) N k_B T and
 *   W = -(3/5) G M^2 / R, giving (5 c_s^2 / G)^(3/2) (3 / (4 pi rho))^(1/2).
 * Turbulent support (common practice): use c_eff^2 = c_s^2 + sigma_1D^2 in place of c_s^2.
 */
import { G } from './constants.js';

/** Name of a Jeans-mass convention. */
export type JeansConvention = 'sphere' | 'cube' | 'virial';

/** All conventions, default first. */
export const JEANS_CONVENTIONS: readonly JeansConvention[] = ['sphere', 'cube', 'virial'];

/** Plain-language definition of a convention, for reports. */
export function describeJeansConvention(c: JeansConvention): string {
  switch (c) {
    case 'sphere': return 'mass of a sphere of diameter lambda_J: (pi^(5/2)/6) c_s^3 G^(-3/2) rho^(-1/2)';
    case 'cube': return 'mass of a cube of side lambda_J: rho lambda_J^3';
    case 'virial': return 'uniform sphere with 2K + W = 0: (5 k_B T/(G mu m_H))^(3/2) (3/(4 pi rho))^(1/2)';
  }
}

/** Jeans length lambda_J = sqrt(pi c^2/(G rho)), cm, for sound speed c (cm/s) and density rho (g/cm^3). */
export function jeansLength(c: number, rho: number): number {
  return Math.sqrt((Math.PI * c * c) / (G.value * rho));
}

/** Jeans mass, g, in the given convention, for (effective) sound speed c (cm/s) and density rho (g/cm^3). */
export function jeansMass(c: number, rho: number, convention: JeansConvention = 'sphere'): number {
  switch (convention) {
    case 'sphere':
      return (Math.PI ** 2.5 / 6) * c ** 3 * G.value ** -1.5 * rho ** -0.5;
    case 'cube':
      return rho * jeansLength(c, rho) ** 3;
    case 'virial':
      return ((5 * c * c) / G.value) ** 1.5 * Math.sqrt(3 / (4 * Math.PI * rho));
  }
}

/** Effective sound speed with turbulent support, sqrt(c_s^2 + sigma_1D^2), cm/s. */
export function effectiveSoundSpeed(cs: number, sigma1D: number): number {
  return Math.sqrt(cs * cs + sigma1D * sigma1D);
}

/** Density, g/cm^3, at which the Jeans mass in the given convention equals mass (g) for sound speed c (cm/s). */
export function densityForJeansMass(c: number, mass: number, convention: JeansConvention = 'sphere'): number {
  // Every convention scales as rho^(-1/2): M_J(rho) = M_J(1) rho^(-1/2).
  const atUnit = jeansMass(c, 1, convention);
  return (atUnit / mass) ** 2;
}
