/**
 * Courant-limited time step, cgs (Courant, Friedrichs & Lewy 1928).
 *
 * Explicit hydrodynamics advances by dt = C dx / (c_s + |v|_max) with Courant number C < 1
 * (grid codes: dx the cell size; particle codes: dx the smoothing length h; common practice).
 */

/** Time step, s, for length dx (cm), sound speed cs (cm/s), largest speed vmax (cm/s) and Courant number C. */
export function courantTimeStep(dx: number, cs: number, vmax: number, courant: number): number {
  return (courant * dx) / (cs + Math.abs(vmax));
}
