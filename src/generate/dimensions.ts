/**
 * Cloud dimensions from a config, analytic and without a grid (cheap: used by `budget`).
 *
 * Units cgs: g, cm, g/cm^3, cm^3, K. The box is cubic, centred on the cloud, side
 * grid.box_size or padding x the cloud's extent (sphere: diameter; filament:
 * max(length, 2 x cross-section radius)). Ambient density = edge density / contrast; ambient
 * temperature = T x contrast under pressure balance (continuous pressure at the edge), else T.
 */
import type { Config } from '../config/schema.js';
import { resolveEnvelope } from './envelope.js';

/** Analytic size, mass and densities of the configured cloud (cgs). */
export interface CloudDimensions {
  /** Cloud mass, g (derived for a filament and for a Bonnor–Ebert sphere given its radius). */
  readonly mass: number;
  /** Radius, cm (filament: cross-section radius; Bonnor–Ebert sphere: derived when not given). */
  readonly radius: number;
  /** Mass / cloud volume, g/cm^3. */
  readonly meanDensity: number;
  /** Central density of the envelope model, g/cm^3. */
  readonly peakDensity: number;
  /** Density at the cloud's edge, g/cm^3. */
  readonly edgeDensity: number;
  /** Cloud volume, cm^3. */
  readonly volume: number;
  /** Side of the cubic box, cm. */
  readonly boxSize: number;
  readonly ambientDensity: number;
  readonly ambientTemperature: number;
  /** 'sphere' or 'filament'. */
  readonly shape: 'sphere' | 'filament';
  /** Filament length, cm (null for spheres). */
  readonly length: number | null;
  /** Largest extent of the cloud, cm. */
  readonly extent: number;
  /** Gravitational energy of the smooth envelope, erg (see envelope.ts for how). */
  readonly gravitationalEnergy: number;
  /** One line describing the envelope and its size. */
  readonly description: string;
}

/** Mass, radius, densities, volume and box of the configured cloud, cgs, computed analytically. */
export function cloudDimensions(config: Config): CloudDimensions {
  const env = resolveEnvelope(config);
  const { contrast, pressure_balance } = config.cloud.ambient;
  const boxSize = config.grid.box_size ?? config.grid.padding * env.extent;
  return {
    mass: env.mass,
    radius: env.params.radius,
    meanDensity: env.mass / env.volume,
    peakDensity: env.params.peakDensity,
    edgeDensity: env.edgeDensity,
    volume: env.volume,
    boxSize,
    ambientDensity: env.edgeDensity / contrast,
    ambientTemperature: pressure_balance ? config.cloud.temperature * contrast : config.cloud.temperature,
    shape: env.shape,
    length: env.shape === 'filament' ? env.params.length : null,
    extent: env.extent,
    gravitationalEnergy: env.gravitationalEnergy,
    description: env.description,
  };
}
