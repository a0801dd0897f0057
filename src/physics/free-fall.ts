/** Free-fall time of a uniform sphere, cgs. */
import { G } from './constants.js';

/** Free-fall time t_ff = sqrt(3 pi / (32 G rho)), s, for density rho in g/cm^3. */
export function freeFallTime(rho: number): number {
  return Math.sqrt((3 * Math.PI) / (32 * G.value * rho));
}
