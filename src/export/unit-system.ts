/**
 * Unit systems for exported initial conditions: cgs (default), SI, and code units with G = 1.
 *
 * Every exported value is the cgs value times `fromCgs[kind]`; `toCgs[kind]` = 1 / fromCgs[kind]
 * takes it back. Temperature is in kelvin in every system.
 *
 * Code units: the user chooses a length unit L and a mass unit M (cgs values); the time unit is
 * T = sqrt(L^3 / (G M)) so that G = 1 in code units (common practice in self-gravity codes).
 * Derived: density M/L^3, velocity L/T, specific energy (L/T)^2.
 * Magnetic field keeps the Gaussian convention (magnetic energy density B^2/(8 pi)): the code
 * unit of B is sqrt(M/L)/T gauss, so that B^2 has the code unit of energy density M/(L T^2).
 * Codes that absorb sqrt(4 pi) into B (Heaviside-Lorentz) divide our code-unit B by sqrt(4 pi).
 * SI: 1 cm = 1e-2 m, 1 g = 1e-3 kg, 1 G = 1e-4 T (SI Brochure, 9th ed., 2019).
 */
import { G } from '../physics/constants.js';

/** Name of an export unit system. */
export type UnitSystemName = 'cgs' | 'si' | 'code';

/** Physical kinds of exported quantity. */
export type QuantityKind = 'length' | 'mass' | 'time' | 'density' | 'velocity' | 'specific_energy' | 'temperature' | 'magnetic_field';

export const QUANTITY_KINDS: readonly QuantityKind[] = ['length', 'mass', 'time', 'density', 'velocity', 'specific_energy', 'temperature', 'magnetic_field'];

/** A unit system: labels and factors per kind (value_out = value_cgs * fromCgs). */
export interface UnitSystem {
  readonly name: UnitSystemName;
  /** Unit label per kind, e.g. "g cm^-3" or "code density (M/L^3)". */
  readonly labels: Readonly<Record<QuantityKind, string>>;
  /** Multiply a cgs value by this to get the value in this system. */
  readonly fromCgs: Readonly<Record<QuantityKind, number>>;
  /** Multiply a value in this system by this to get cgs (1 / fromCgs). */
  readonly toCgs: Readonly<Record<QuantityKind, number>>;
  /** For code units: the base units in cgs (length cm, mass g, time s); null otherwise. */
  readonly codeBase: { length: number; mass: number; time: number } | null;
}

const CGS_LABELS: Record<QuantityKind, string> = {
  length: 'cm', mass: 'g', time: 's', density: 'g cm^-3', velocity: 'cm s^-1',
  specific_energy: 'erg g^-1', temperature: 'K', magnetic_field: 'G (gauss)',
};
const SI_LABELS: Record<QuantityKind, string> = {
  length: 'm', mass: 'kg', time: 's', density: 'kg m^-3', velocity: 'm s^-1',
  specific_energy: 'J kg^-1', temperature: 'K', magnetic_field: 'T (tesla)',
};

function invert(f: Record<QuantityKind, number>): Record<QuantityKind, number> {
  const out = {} as Record<QuantityKind, number>;
  for (const k of QUANTITY_KINDS) out[k] = 1 / f[k];
  return out;
}

/** Time unit sqrt(L^3/(G M)), s, for code length unit L (cm) and mass unit M (g). */
export function codeTimeUnit(lengthCm: number, massG: number): number {
  return Math.sqrt((lengthCm * lengthCm * lengthCm) / (G.value * massG));
}

/** The unit system of the given name; code units need the length (cm) and mass (g) units. */
export function unitSystem(name: UnitSystemName, code?: { length: number; mass: number }): UnitSystem {
  if (name === 'cgs') {
    const f: Record<QuantityKind, number> = { length: 1, mass: 1, time: 1, density: 1, velocity: 1, specific_energy: 1, temperature: 1, magnetic_field: 1 };
    return { name, labels: CGS_LABELS, fromCgs: f, toCgs: invert(f), codeBase: null };
  }
  if (name === 'si') {
    const f: Record<QuantityKind, number> = {
      length: 1e-2, mass: 1e-3, time: 1, density: 1e3, velocity: 1e-2,
      specific_energy: 1e-4, temperature: 1, magnetic_field: 1e-4,
    };
    return { name, labels: SI_LABELS, fromCgs: f, toCgs: invert(f), codeBase: null };
  }
  if (!code || !(code.length > 0) || !(code.mass > 0)) throw new RangeError('code units need positive length and mass units');
  const L = code.length;
  const M = code.mass;
  const T = codeTimeUnit(L, M);
  const V = L / T;
  const B = Math.sqrt(M / L) / T;
  const unitsCgs: Record<QuantityKind, number> = {
    length: L, mass: M, time: T, density: M / (L * L * L), velocity: V,
    specific_energy: V * V, temperature: 1, magnetic_field: B,
  };
  const labels: Record<QuantityKind, string> = {
    length: `code length (1 = ${L.toPrecision(10)} cm)`,
    mass: `code mass (1 = ${M.toPrecision(10)} g)`,
    time: `code time (1 = ${T.toPrecision(10)} s; sqrt(L^3/(G M)), G = 1)`,
    density: `code density (1 = ${unitsCgs.density.toPrecision(10)} g cm^-3)`,
    velocity: `code velocity (1 = ${V.toPrecision(10)} cm s^-1)`,
    specific_energy: `code specific energy (1 = ${(V * V).toPrecision(10)} erg g^-1)`,
    temperature: 'K',
    magnetic_field: `code field, Gaussian convention (1 = ${B.toPrecision(10)} G)`,
  };
  return { name, labels, fromCgs: invert(unitsCgs), toCgs: unitsCgs, codeBase: { length: L, mass: M, time: T } };
}

/** The gravitational constant expressed in a unit system (1 in code units by construction). */
export function gravitationalConstantIn(u: UnitSystem): number {
  // G has dimensions length^3 mass^-1 time^-2
  return (G.value * u.fromCgs.length ** 3) / (u.fromCgs.mass * u.fromCgs.time ** 2);
}

/** JSON description of a unit system for manifests and file attributes. */
export function describeUnitSystem(u: UnitSystem): Record<string, unknown> {
  const kinds: Record<string, { unit: string; to_cgs: number; from_cgs: number }> = {};
  for (const k of QUANTITY_KINDS) kinds[k] = { unit: u.labels[k], to_cgs: u.toCgs[k], from_cgs: u.fromCgs[k] };
  return {
    name: u.name,
    note: 'value_in_file * to_cgs = value in cgs; temperature is in kelvin in every system',
    gravitational_constant: gravitationalConstantIn(u),
    ...(u.codeBase ? { code_units_cgs: { length_cm: u.codeBase.length, mass_g: u.codeBase.mass, time_s: u.codeBase.time } } : {}),
    quantities: kinds,
  };
}
