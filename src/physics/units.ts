/**
 * Parsing of quantities written with units in config files and options.
 *
 * A quantity is a number followed by a unit expression: `"500 Msun"`, `"1.2 pc"`,
 * `"1e4 cm^-3"`, `"0.3 km/s"`, `"10 uG"`, `"3.82e-18 g cm^-3"`, `"7.2e-13 s^-1"`,
 * `"30 Msun/pc"`. Units multiply by space or `*`, divide by `/`, and take integer powers
 * with `^` (`cm^-3`). Everything is returned in cgs. Magnetic field has its own dimension
 * (gauss), so that a field can never be confused with a density.
 */
import { AU, M_SUN, MYR, PC, YEAR } from './constants.js';

/** Exponents of mass, length, time, temperature and magnetic field. */
export type Dimension = readonly [m: number, l: number, t: number, k: number, b: number];

/** Named dimensions used by the config. */
export const DIM = {
  none: [0, 0, 0, 0, 0],
  mass: [1, 0, 0, 0, 0],
  length: [0, 1, 0, 0, 0],
  time: [0, 0, 1, 0, 0],
  temperature: [0, 0, 0, 1, 0],
  field: [0, 0, 0, 0, 1],
  velocity: [0, 1, -1, 0, 0],
  rate: [0, 0, -1, 0, 0],
  numberDensity: [0, -3, 0, 0, 0],
  massDensity: [1, -3, 0, 0, 0],
  lineMass: [1, -1, 0, 0, 0],
  energy: [1, 2, -2, 0, 0],
} as const satisfies Record<string, Dimension>;

/** Name of a dimension key of DIM. */
export type DimensionName = keyof typeof DIM;

interface UnitDef { factor: number; dim: Dimension }

const UNITS: Record<string, UnitDef> = {
  g: { factor: 1, dim: DIM.mass },
  kg: { factor: 1e3, dim: DIM.mass },
  Msun: { factor: M_SUN.value, dim: DIM.mass },
  cm: { factor: 1, dim: DIM.length },
  m: { factor: 1e2, dim: DIM.length },
  km: { factor: 1e5, dim: DIM.length },
  au: { factor: AU.value, dim: DIM.length },
  pc: { factor: PC.value, dim: DIM.length },
  kpc: { factor: 1e3 * PC.value, dim: DIM.length },
  s: { factor: 1, dim: DIM.time },
  yr: { factor: YEAR.value, dim: DIM.time },
  kyr: { factor: 1e3 * YEAR.value, dim: DIM.time },
  Myr: { factor: MYR.value, dim: DIM.time },
  K: { factor: 1, dim: DIM.temperature },
  G: { factor: 1, dim: DIM.field },
  mG: { factor: 1e-3, dim: DIM.field },
  uG: { factor: 1e-6, dim: DIM.field },
  nG: { factor: 1e-9, dim: DIM.field },
  erg: { factor: 1, dim: DIM.energy },
  J: { factor: 1e7, dim: DIM.energy },
};

/** Error for a quantity string that cannot be parsed or has the wrong dimension. */
export class UnitError extends Error {
  override name = 'UnitError';
}

/** Human-readable form of a dimension, e.g. "mass length^-3". */
export function describeDimension(dim: Dimension): string {
  const names = ['mass', 'length', 'time', 'temperature', 'magnetic field'];
  const parts = dim.flatMap((p, i) => (p === 0 ? [] : [p === 1 ? names[i] : `${names[i]}^${p}`]));
  return parts.length ? parts.join(' ') : 'dimensionless';
}

/** Parses a unit expression like "km/s" or "g cm^-3" to its cgs factor and dimension. */
export function parseUnit(expr: string): UnitDef {
  let factor = 1;
  const dim = [0, 0, 0, 0, 0];
  const cleaned = expr.trim();
  if (cleaned === '') return { factor: 1, dim: DIM.none };
  const groups = cleaned.split('/');
  if (groups.length > 2) throw new UnitError(`unit "${expr}" has more than one "/"`);
  groups.forEach((group, gi) => {
    const sign = gi === 0 ? 1 : -1;
    const tokens = group.split(/[\s*]+/).filter((t) => t.length > 0);
    if (tokens.length === 0) throw new UnitError(`unit "${expr}" has an empty part`);
    for (const token of tokens) {
      const m = /^([A-Za-z]+)(?:\^?(-?\d+))?$/.exec(token);
      if (!m) throw new UnitError(`cannot read unit "${token}" in "${expr}"`);
      const def = UNITS[m[1]!];
      if (!def) throw new UnitError(`unknown unit "${m[1]}" in "${expr}" (known: ${Object.keys(UNITS).join(', ')})`);
      const power = sign * (m[2] === undefined ? 1 : Number(m[2]));
      factor *= def.factor ** power;
      for (let i = 0; i < 5; i++) dim[i]! += def.dim[i]! * power;
    }
  });
  return { factor, dim: dim as unknown as Dimension };
}

function sameDimension(a: Dimension, b: Dimension): boolean {
  return a.every((x, i) => x === b[i]);
}

/**
 * Parses "value unit" (or a bare number, taken in `defaultUnit`) to a cgs value of the
 * expected dimension. Throws UnitError with a message naming what was expected.
 * Example: parseQuantity("1.2 pc", "length", "pc") === 3.7028e18 (cm).
 */
export function parseQuantity(input: string | number, expected: DimensionName, defaultUnit: string): number {
  if (typeof input === 'number') {
    if (!Number.isFinite(input)) throw new UnitError(`expected a finite number, got ${input}`);
    return input * parseUnit(defaultUnit).factor;
  }
  const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*)$/.exec(input);
  if (!m) throw new UnitError(`expected a number with a unit of ${describeDimension(DIM[expected])} (e.g. "${exampleFor(expected)}"), got "${input}"`);
  const value = Number(m[1]);
  const unitText = m[2]!.trim();
  const unit = unitText === '' ? parseUnit(defaultUnit) : parseUnit(unitText);
  if (!sameDimension(unit.dim, DIM[expected])) {
    throw new UnitError(`expected ${describeDimension(DIM[expected])} (e.g. "${exampleFor(expected)}"), got "${input}" which is ${describeDimension(unit.dim)}`);
  }
  return value * unit.factor;
}

/** Converts a cgs value to the given unit expression, e.g. toUnit(PC, "pc") === 1. */
export function toUnit(valueCgs: number, unit: string): number {
  return valueCgs / parseUnit(unit).factor;
}

/** An example quantity string for a dimension, for error messages. */
export function exampleFor(dim: DimensionName): string {
  const examples: Record<DimensionName, string> = {
    none: '1', mass: '500 Msun', length: '1.2 pc', time: '1 Myr', temperature: '12 K', field: '10 uG',
    velocity: '0.3 km/s', rate: '7.2e-13 s^-1', numberDensity: '1e4 cm^-3', massDensity: '1e-19 g cm^-3',
    lineMass: '30 Msun/pc', energy: '1e45 erg',
  };
  return examples[dim];
}
