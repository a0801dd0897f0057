/**
 * Clumpy structure: clumps from a mass spectrum with a size–mass relation, or a box fractal.
 *
 * Positions and sizes are drawn in physical units (cm) from seedrandom streams keyed by the
 * seed, never from the grid, so the same seed places the same clumps at every resolution.
 * Units: masses g, lengths cm. The cloud is centred on the origin (see envelope.ts).
 *
 * Clumps: N masses from dN/dM ~ M^-slope between M_max/range and M_max (inverse-CDF sampling
 * of the truncated power law), scaled so they sum to mass_fraction x M; radius
 * R_i = max_radius_fraction x R x (M_i / M_largest)^exponent (a Larson-like size–mass
 * relation, Larson 1981); each clump is a Gaussian of sigma = R_i / 2; centres uniform in the
 * cloud volume.
 * Fractal: the box-fractal construction (Goodwin & Whitworth 2004, from memory): a cube of
 * side the cloud's extent is halved into 8 sub-cubes per level and each child survives with
 * probability 2^(D - 3), so the expected number of survivors per level is 2^D (box-counting
 * dimension D). Every parent keeps at least one child (a slight bias upward of D for sparse
 * trees, noted). Children are jittered by up to a quarter of their cube. Leaves inside the
 * cloud share mass_fraction x M equally, each a Gaussian of sigma = half the leaf cube side.
 */
import seedrandom from 'seedrandom';
import type { Blob } from './deposit.js';
import type { EnvelopeParams } from './envelope.js';

type Rng = () => number;

/** True when (x, y, z) cm lies in the cloud region of the envelope. */
export function insideCloud(p: EnvelopeParams, x: number, y: number, z: number): boolean {
  if (p.model === 'filament-uniform' || p.model === 'filament-plummer') {
    const along = p.axis === 0 ? x : p.axis === 1 ? y : z;
    return Math.abs(along) <= p.length / 2 && x * x + y * y + z * z - along * along <= p.radius * p.radius;
  }
  return x * x + y * y + z * z <= p.radius * p.radius;
}

/** Half-sides (cm) of the cloud's bounding box along x, y, z. */
function halfSides(p: EnvelopeParams): [number, number, number] {
  const r = p.radius;
  if (p.length === 0) return [r, r, r];
  const h: [number, number, number] = [r, r, r];
  h[p.axis] = p.length / 2;
  return h;
}

/** A point uniform in the cloud volume, by rejection from its bounding box. */
function pointInCloud(p: EnvelopeParams, rng: Rng): [number, number, number] {
  const h = halfSides(p);
  for (;;) {
    const x = (2 * rng() - 1) * h[0], y = (2 * rng() - 1) * h[1], z = (2 * rng() - 1) * h[2];
    if (insideCloud(p, x, y, z)) return [x, y, z];
  }
}

/** Clump options as in the config's structure section (kind: clumps). */
export interface ClumpOptions {
  readonly count: number;
  readonly mass_fraction: number;
  readonly spectrum_slope: number;
  readonly mass_range: number;
  readonly size_mass_exponent: number;
  readonly max_radius_fraction: number;
}

/** Draws clumps (Gaussian blobs, cm and g) for cloud mass M (g) in the envelope's region. */
export function drawClumps(p: EnvelopeParams, mass: number, o: ClumpOptions, seed: number): Blob[] {
  const rng = seedrandom(`fragplan:clumps:${seed}`);
  const a = 1 / o.mass_range;
  const e = 1 - o.spectrum_slope;
  const xs: number[] = [];
  for (let n = 0; n < o.count; n++) {
    const u = rng();
    // inverse CDF of x^-slope on [a, 1]
    xs.push(o.mass_range === 1 ? 1 : (a ** e + u * (1 - a ** e)) ** (1 / e));
  }
  const total = xs.reduce((s, x) => s + x, 0);
  const xMax = Math.max(...xs);
  const blobs: Blob[] = [];
  for (const x of xs) {
    const [cx, cy, cz] = pointInCloud(p, rng);
    const radius = o.max_radius_fraction * p.radius * (x / xMax) ** o.size_mass_exponent;
    blobs.push({ x: cx, y: cy, z: cz, sigma: radius / 2, mass: (o.mass_fraction * mass * x) / total });
  }
  return blobs;
}

/** Fractal options as in the config's structure section (kind: fractal). */
export interface FractalOptions {
  readonly dimension: number;
  readonly levels: number;
  readonly mass_fraction: number;
}

/** Draws box-fractal leaves (Gaussian blobs, cm and g) for cloud mass M (g); empty if no leaf falls in the cloud. */
export function drawFractal(p: EnvelopeParams, mass: number, o: FractalOptions, seed: number): Blob[] {
  const rng = seedrandom(`fragplan:fractal:${seed}`);
  const h = halfSides(p);
  const side = 2 * Math.max(h[0], h[1], h[2]);
  const keep = 2 ** (o.dimension - 3);
  let points: Array<[number, number, number]> = [[0, 0, 0]];
  let cube = side;
  for (let level = 0; level < o.levels; level++) {
    const child = cube / 2;
    const next: Array<[number, number, number]> = [];
    for (const [px, py, pz] of points) {
      const kids: Array<[number, number, number]> = [];
      for (let o8 = 0; o8 < 8; o8++) {
        const cx = px + ((o8 & 1 ? 1 : -1) * child) / 2;
        const cy = py + ((o8 & 2 ? 1 : -1) * child) / 2;
        const cz = pz + ((o8 & 4 ? 1 : -1) * child) / 2;
        const survive = rng() < keep;
        const jx = (rng() - 0.5) * child / 2, jy = (rng() - 0.5) * child / 2, jz = (rng() - 0.5) * child / 2;
        if (survive) kids.push([cx + jx, cy + jy, cz + jz]);
      }
      if (kids.length === 0) {
        const o8 = Math.min(7, Math.floor(rng() * 8));
        kids.push([px + ((o8 & 1 ? 1 : -1) * child) / 2, py + ((o8 & 2 ? 1 : -1) * child) / 2, pz + ((o8 & 4 ? 1 : -1) * child) / 2]);
      }
      next.push(...kids);
    }
    points = next;
    cube = child;
  }
  const leaves = points.filter(([x, y, z]) => insideCloud(p, x, y, z));
  const m = leaves.length ? (o.mass_fraction * mass) / leaves.length : 0;
  return leaves.map(([x, y, z]) => ({ x, y, z, sigma: cube / 2, mass: m }));
}
