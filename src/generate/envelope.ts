/**
 * Envelope models: the smooth density profile of the cloud before any structure, cgs.
 *
 * Spheres are centred on the origin (the box centre); a filament is a cylinder of the given
 * length along one axis, centred on the origin, with flat ends. Models:
 * - uniform sphere: rho = M / (4/3 pi R^3);
 * - Bonnor–Ebert sphere: isothermal Lane–Emden profile (src/physics/bonnor-ebert.ts);
 * - power law with a flat core: rho = rho_c for r < r_c, rho_c (r/r_c)^-p out to R;
 * - filament: uniform cylinder, or Plummer-like rho_c / (1 + (r/r0)^2) in the cylindrical
 *   radius r, truncated at the cross-section radius R; mass = line mass x length.
 * Gravitational energy W (for alpha and beta): for spheres the radial integral
 * W = -4 pi G int_0^R M(r) rho(r) r dr of the profile (exact for the smooth sphere; it ignores
 * structure, the m-mode perturbation and the ambient gas); for a filament the virial term of
 * an infinite cylinder per unit length, -G lambda^2 (Ostriker 1964; Fiege & Pudritz 2000),
 * times the length: exact only for length >> radius.
 * EnvelopeParams is plain data so that worker threads can evaluate it.
 */
import type { Config } from '../config/schema.js';
import { InputError } from '../input-error.js';
import { G, M_SUN, PC } from '../physics/constants.js';
import { soundSpeed } from '../physics/sound-speed.js';
import { uniformSphereGravitationalEnergy } from '../physics/virial.js';
import { bonnorEbertFromMass, bonnorEbertFromRadius, laneEmdenPsi } from '../physics/bonnor-ebert.js';

/** Plain-data description of the envelope, evaluated by envelopeDensity (cgs). */
export interface EnvelopeParams {
  readonly model: 'uniform' | 'bonnor-ebert' | 'power-law' | 'filament-uniform' | 'filament-plummer';
  /** Sphere radius or filament cross-section radius, cm. */
  readonly radius: number;
  /** Central (peak) density, g/cm^3. */
  readonly peakDensity: number;
  /** Flat-core radius (power law) or Plummer radius (filament), cm; 0 otherwise. */
  readonly coreRadius: number;
  /** Power-law index p (rho ~ r^-p). */
  readonly index: number;
  /** Bonnor–Ebert: scale length a, cm, xi_max and the Lane–Emden table (psi, psi' at xi = i step). */
  readonly scaleLength: number;
  readonly xiMax: number;
  readonly step: number;
  readonly psi: Float64Array | null;
  readonly dpsi: Float64Array | null;
  /** Filament length, cm, and axis (0 x, 1 y, 2 z); length 0 for spheres. */
  readonly length: number;
  readonly axis: 0 | 1 | 2;
}

/** An envelope with its integral properties (cgs). */
export interface Envelope {
  readonly params: EnvelopeParams;
  readonly shape: 'sphere' | 'filament';
  readonly mass: number;
  readonly volume: number;
  readonly edgeDensity: number;
  /** Gravitational energy W (negative), erg; see the file comment for how it is computed. */
  readonly gravitationalEnergy: number;
  /** Largest extent of the cloud, cm (sphere: diameter; filament: max(length, 2 radius)). */
  readonly extent: number;
  /** One-line description with numbers, e.g. "Bonnor-Ebert sphere, xi_max 6.451, R 0.049 pc". */
  readonly description: string;
}

/** Density, g/cm^3, of the envelope at (x, y, z) cm; 0 outside the cloud. */
export function envelopeDensity(p: EnvelopeParams, x: number, y: number, z: number): number {
  if (p.model === 'filament-uniform' || p.model === 'filament-plummer') {
    const along = p.axis === 0 ? x : p.axis === 1 ? y : z;
    if (Math.abs(along) > p.length / 2) return 0;
    const r2 = x * x + y * y + z * z - along * along;
    if (r2 > p.radius * p.radius) return 0;
    if (p.model === 'filament-uniform') return p.peakDensity;
    return p.peakDensity / (1 + r2 / (p.coreRadius * p.coreRadius));
  }
  const r2 = x * x + y * y + z * z;
  if (r2 > p.radius * p.radius) return 0;
  switch (p.model) {
    case 'uniform':
      return p.peakDensity;
    case 'power-law': {
      const r = Math.sqrt(r2);
      return r <= p.coreRadius ? p.peakDensity : p.peakDensity * (r / p.coreRadius) ** -p.index;
    }
    case 'bonnor-ebert':
      return p.peakDensity * Math.exp(-laneEmdenPsi({ step: p.step, xiMax: p.xiMax, psi: p.psi!, dpsi: p.dpsi! }, Math.sqrt(r2) / p.scaleLength));
  }
}

/** Radial density rho(r), g/cm^3, of a spherical envelope at radius r (cm). */
function radial(p: EnvelopeParams, r: number): number {
  return envelopeDensity(p, r, 0, 0);
}

/** W = -4 pi G int M(r) rho(r) r dr by the trapezoid rule on 2e5 intervals (relative error ~1e-9), erg. */
function sphereGravitationalEnergy(p: EnvelopeParams): number {
  const n = 200_000;
  const h = p.radius / n;
  let m = 0, w = 0;
  let rPrev = 0, rhoPrev = radial(p, 0), fPrev = 0;
  for (let i = 1; i <= n; i++) {
    const r = i === n ? p.radius * (1 - 1e-15) : i * h;
    const rho = radial(p, r);
    m += 4 * Math.PI * 0.5 * (rhoPrev * rPrev * rPrev + rho * r * r) * (r - rPrev);
    const f = m * rho * r;
    w += 0.5 * (fPrev + f) * (r - rPrev);
    rPrev = r; rhoPrev = rho; fPrev = f;
  }
  return -4 * Math.PI * G.value * w;
}

function blank(model: EnvelopeParams['model'], radius: number, peak: number): EnvelopeParams {
  return { model, radius, peakDensity: peak, coreRadius: 0, index: 0, scaleLength: 0, xiMax: 0, step: 0, psi: null, dpsi: null, length: 0, axis: 2 };
}

const fmtPc = (x: number): string => `${(x / PC.value).toPrecision(3)} pc`;

function need<T>(v: T | undefined, key: string, why: string): T {
  if (v === undefined) throw new InputError(`${key}: required ${why}`);
  return v;
}

/** Resolves the envelope of a config: mass, radius, central density and W (cgs). Throws InputError on missing keys. */
export function resolveEnvelope(config: Config): Envelope {
  const c = config.cloud;
  const env = c.envelope;
  const cs = soundSpeed(c.temperature, c.mu);
  switch (env.model) {
    case 'uniform': {
      const M = need(c.mass, 'cloud.mass', 'for a uniform sphere (e.g. "500 Msun")');
      const R = need(c.radius, 'cloud.radius', 'for a uniform sphere (e.g. "1 pc")');
      const V = (4 / 3) * Math.PI * R ** 3;
      const params = blank('uniform', R, M / V);
      return { params, shape: 'sphere', mass: M, volume: V, edgeDensity: M / V, gravitationalEnergy: uniformSphereGravitationalEnergy(M, R), extent: 2 * R, description: `uniform sphere, R ${fmtPc(R)}` };
    }
    case 'bonnor-ebert': {
      if (c.mass !== undefined && c.radius !== undefined) {
        throw new InputError('cloud.radius: a Bonnor-Ebert sphere takes cloud.mass or cloud.radius, not both (the other follows from the temperature and xi_max)');
      }
      if (c.mass === undefined && c.radius === undefined) throw new InputError('cloud.mass: a Bonnor-Ebert sphere needs cloud.mass or cloud.radius');
      const be = c.mass !== undefined ? bonnorEbertFromMass(c.mass, cs, env.xi_max) : bonnorEbertFromRadius(c.radius!, cs, env.xi_max);
      const params: EnvelopeParams = { ...blank('bonnor-ebert', be.radius, be.centralDensity), scaleLength: be.scaleLength, xiMax: be.xiMax, step: be.table.step, psi: be.table.psi, dpsi: be.table.dpsi };
      const V = (4 / 3) * Math.PI * be.radius ** 3;
      return {
        params, shape: 'sphere', mass: be.mass, volume: V, edgeDensity: be.edgeDensity, gravitationalEnergy: sphereGravitationalEnergy(params), extent: 2 * be.radius,
        description: `Bonnor-Ebert sphere, xi_max ${be.xiMax.toFixed(3)}, R ${fmtPc(be.radius)}, centre-to-edge contrast ${(be.centralDensity / be.edgeDensity).toFixed(2)}`,
      };
    }
    case 'power-law': {
      const M = need(c.mass, 'cloud.mass', 'for a power-law sphere');
      const R = need(c.radius, 'cloud.radius', 'for a power-law sphere');
      const rc = env.core_radius ?? 0.1 * R;
      if (!(rc < R)) throw new InputError(`cloud.envelope.core_radius: expected less than cloud.radius (${fmtPc(R)}), got ${fmtPc(rc)}`);
      const p = env.index;
      // M = 4 pi rho_c [r_c^3/3 + r_c^p (R^(3-p) - r_c^(3-p)) / (3 - p)]
      const shape = rc ** 3 / 3 + (rc ** p * (R ** (3 - p) - rc ** (3 - p))) / (3 - p);
      const rhoC = M / (4 * Math.PI * shape);
      const params: EnvelopeParams = { ...blank('power-law', R, rhoC), coreRadius: rc, index: p };
      const V = (4 / 3) * Math.PI * R ** 3;
      return {
        params, shape: 'sphere', mass: M, volume: V, edgeDensity: rhoC * (R / rc) ** -p, gravitationalEnergy: sphereGravitationalEnergy(params), extent: 2 * R,
        description: `power-law sphere rho ~ r^-${p}, flat core ${fmtPc(rc)}, R ${fmtPc(R)}`,
      };
    }
    case 'filament': {
      const R = need(c.radius, 'cloud.radius', 'for a filament: its cross-section radius (e.g. "0.05 pc")');
      const lambda = env.line_mass;
      const L = env.length;
      const M = lambda * L;
      if (c.mass !== undefined && Math.abs(c.mass - M) > 1e-6 * M) {
        throw new InputError(`cloud.mass: a filament's mass follows from line_mass x length (${(M / M_SUN.value).toPrecision(4)} Msun); leave cloud.mass out or make it agree`);
      }
      const axis = env.axis === 'x' ? 0 : env.axis === 'y' ? 1 : 2;
      const V = Math.PI * R * R * L;
      let params: EnvelopeParams;
      let edge: number;
      if (env.profile === 'uniform') {
        params = { ...blank('filament-uniform', R, lambda / (Math.PI * R * R)), length: L, axis };
        edge = params.peakDensity;
      } else {
        const r0 = env.core_radius ?? 0.1 * R;
        if (!(r0 < R)) throw new InputError(`cloud.envelope.core_radius: expected less than cloud.radius (${fmtPc(R)}), got ${fmtPc(r0)}`);
        // lambda = pi rho_c r0^2 ln(1 + (R/r0)^2)
        const rhoC = lambda / (Math.PI * r0 * r0 * Math.log(1 + (R / r0) ** 2));
        params = { ...blank('filament-plummer', R, rhoC), coreRadius: r0, length: L, axis };
        edge = rhoC / (1 + (R / r0) ** 2);
      }
      return {
        params, shape: 'filament', mass: M, volume: V, edgeDensity: edge, gravitationalEnergy: -G.value * lambda * lambda * L, extent: Math.max(L, 2 * R),
        description: `${env.profile} filament along ${env.axis}, length ${fmtPc(L)}, radius ${fmtPc(R)}`,
      };
    }
  }
}
