/**
 * The uniform magnetic field of the cloud (gauss), from a strength or a mass-to-flux ratio.
 *
 * The field is uniform over the whole box and stored cell-centred (B at cell centres, not on
 * faces: a code that needs face-centred B can average or simply copy a uniform field).
 * Mass-to-flux uses the flux through the cloud's cross-section perpendicular to B: pi R^2 for
 * a sphere; for a filament of radius R and length L at angle theta between B and its axis, the
 * projected area pi R^2 |cos theta| + 2 R L |sin theta|. Critical value 1/(2 pi sqrt G)
 * (Nakano & Nakamura 1978), in src/physics/magnetic.ts.
 */
import type { Config } from '../config/schema.js';
import type { Envelope } from './envelope.js';
import { fieldForMassToFlux, massToFluxRelative } from '../physics/magnetic.js';

/** Field strength (G), unit direction and mass-to-flux ratio relative to critical. */
export interface MagneticSetup {
  readonly field: number;
  readonly direction: [number, number, number];
  readonly massToFluxRelative: number | null;
  /** Cloud cross-section perpendicular to B, cm^2. */
  readonly area: number;
}

/** Cross-section of the cloud perpendicular to the unit direction d, cm^2. */
export function crossSection(env: Envelope, d: readonly number[]): number {
  const R = env.params.radius;
  if (env.shape === 'sphere') return Math.PI * R * R;
  const cosT = Math.abs(d[env.params.axis]!);
  const sinT = Math.sqrt(Math.max(0, 1 - cosT * cosT));
  return Math.PI * R * R * cosT + 2 * R * env.params.length * sinT;
}

/** Resolves the config's magnetic section (null when absent). */
export function magneticSetup(config: Config, env: Envelope): MagneticSetup | null {
  const m = config.cloud.magnetic;
  if (!m) return null;
  const n = Math.hypot(...m.direction);
  const direction: [number, number, number] = [m.direction[0] / n, m.direction[1] / n, m.direction[2] / n];
  const area = crossSection(env, direction);
  const field = m.field !== undefined ? m.field : fieldForMassToFlux(m.mass_to_flux!, env.mass, area);
  return { field, direction, area, massToFluxRelative: field > 0 ? massToFluxRelative(env.mass, field, area) : null };
}
