/**
 * Resolution criteria for grid and particle codes, cgs.
 *
 * Truelove et al. (1997): the Jeans number J = dx / lambda_J must stay <= 1/N_J with
 * N_J >= 4; the densest gas a cell of size dx resolves is rho_max = pi c_s^2 / (G (N_J dx)^2).
 * Federrath et al. (2011) recommend N_J >= 30 for turbulence and dynamo studies.
 * Bate & Burkert (1997): a particle code resolves masses above ~ 2 N_neigh m_particle.
 * Federrath et al. (2010): sink accretion radius ~ 2.5 dx_min and threshold
 * rho_sink = pi c_s^2 / (4 G r_acc^2). Smoothing length h = eta (m/rho)^(1/3), eta ~ 1.2 (Price 2012).
 */
import { G } from './constants.js';
import { jeansLength } from './jeans.js';

/** Truelove et al. (1997) default cells per Jeans length. */
export const TRUELOVE_CELLS_PER_JEANS_LENGTH = 4;
/** Federrath et al. (2011) recommended cells per Jeans length for turbulence and dynamo studies. */
export const TURBULENCE_CELLS_PER_JEANS_LENGTH = 30;
/** Federrath et al. (2010) sink accretion radius in finest cells. */
export const SINK_RADIUS_CELLS = 2.5;
/** Price (2012) smoothing-length factor eta. */
export const SMOOTHING_ETA = 1.2;

/** Jeans number J = dx / lambda_J, dimensionless, for cell size dx (cm), sound speed c (cm/s), density rho (g/cm^3). */
export function jeansNumber(dx: number, c: number, rho: number): number {
  return dx / jeansLength(c, rho);
}

/** Max density resolved with N_J cells per Jeans length, pi c^2/(G (N_J dx)^2), g/cm^3 (Truelove et al. 1997). */
export function maxResolvedDensity(c: number, dx: number, cellsPerJeansLength: number): number {
  const l = cellsPerJeansLength * dx;
  return (Math.PI * c * c) / (G.value * l * l);
}

/** Sink threshold density pi c^2/(4 G r_acc^2), g/cm^3 (Federrath et al. 2010), r_acc in cm. */
export function sinkThresholdDensity(c: number, accretionRadius: number): number {
  return (Math.PI * c * c) / (4 * G.value * accretionRadius * accretionRadius);
}

/** Minimum resolvable mass of a particle code, factor * N_neigh * m_particle, g (Bate & Burkert 1997; factor ~2). */
export function particleResolvableMass(particleMass: number, neighbours: number, factor = 2): number {
  return factor * neighbours * particleMass;
}

/** Smoothing length h = eta (m / rho)^(1/3), cm (Price 2012), for particle mass m (g) and density rho (g/cm^3). */
export function smoothingLength(particleMass: number, rho: number, eta = SMOOTHING_ETA): number {
  return eta * Math.cbrt(particleMass / rho);
}
