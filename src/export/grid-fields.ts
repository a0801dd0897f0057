/**
 * The gridded fields an export writes, and their conversion plane by plane.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k,
 * i along x; cell-centred (the magnetic field too); box [-L/2, L/2)^3; Cloud fields are cgs
 * Float32Array. A "plane" is the contiguous block of ny*nz values at fixed i.
 *
 * Thermal field: temperature (K) or specific internal energy u of an ideal gas,
 *   u = c_s^2 / (gamma - 1) = k_B T / ((gamma - 1) mu m_H), gamma = 5/3, i.e. u = (3/2) k_B T / (mu m_H)
 * (ideal gas with gamma = 5/3: the rotational levels of H2 are not excited in cold molecular gas
 * below ~100 K, so it behaves as monatomic; common practice).
 */
import type { Cloud } from '../generate/cloud.js';
import type { QuantityKind, UnitSystem } from './unit-system.js';
import { internalEnergyPerKelvin } from '../physics/internal-energy.js';

export { INTERNAL_ENERGY_GAMMA, internalEnergyPerKelvin } from '../physics/internal-energy.js';

/** Which thermal field is written. */
export type ThermalField = 'temperature' | 'internal_energy';

/** One exported scalar field: a Cloud array, its kind and the factor from cgs to file values. */
export interface GridField {
  /** File/dataset name: density, velocity_x, ..., temperature or internal_energy, magnetic_x, ... */
  readonly name: string;
  readonly kind: QuantityKind;
  readonly description: string;
  readonly source: Float32Array;
  /** file value = source value * scale (unit conversion, and u per K for internal energy). */
  readonly scale: number;
  /** Unit label in the chosen system. */
  readonly unit: string;
  /** Multiply a file value by this to get cgs (for internal energy: erg/g). */
  readonly toCgs: number;
}

/** A vector quantity made of three GridFields (for formats that store vectors, e.g. VTK). */
export interface GridVector {
  readonly name: string;
  readonly components: readonly [GridField, GridField, GridField];
}

/** The list of scalar fields to export from a cloud, in the given units and thermal field. */
export function gridFields(cloud: Cloud, units: UnitSystem, thermal: ThermalField): GridField[] {
  const f = (name: string, kind: QuantityKind, description: string, source: Float32Array, extra = 1): GridField => ({
    name, kind, description, source, scale: units.fromCgs[kind] * extra, unit: units.labels[kind], toCgs: units.toCgs[kind],
  });
  const axes = ['x', 'y', 'z'] as const;
  const out: GridField[] = [f('density', 'density', 'gas mass density', cloud.density)];
  axes.forEach((a, c) => out.push(f(`velocity_${a}`, 'velocity', `gas velocity, ${a} component`, cloud.velocity[c]!)));
  if (thermal === 'temperature') out.push(f('temperature', 'temperature', 'gas temperature', cloud.temperature));
  else {
    out.push(f('internal_energy', 'specific_energy',
      `specific internal energy u = k_B T / ((gamma - 1) mu m_H), gamma = 5/3, mu = ${cloud.summary.mu}`,
      cloud.temperature, internalEnergyPerKelvin(cloud.summary.mu)));
  }
  if (cloud.magnetic) axes.forEach((a, c) => out.push(f(`magnetic_${a}`, 'magnetic_field', `magnetic field, ${a} component, cell-centred`, cloud.magnetic![c]!)));
  return out;
}

/** Groups velocity_* and magnetic_* into vectors; other fields stay scalars. */
export function groupVectors(fields: readonly GridField[]): Array<GridField | GridVector> {
  const out: Array<GridField | GridVector> = [];
  for (const f of fields) {
    const m = /^(.*)_x$/.exec(f.name);
    if (m) {
      const y = fields.find((g) => g.name === `${m[1]}_y`);
      const z = fields.find((g) => g.name === `${m[1]}_z`);
      if (y && z) { out.push({ name: m[1]!, components: [f, y, z] }); continue; }
    }
    if (/_[yz]$/.test(f.name) && fields.some((g) => g.name === f.name.replace(/_[yz]$/, '_x'))) continue;
    out.push(f);
  }
  return out;
}

/** Writes plane i of a field, converted, into out (length ny*nz). */
export function fillPlane(field: GridField, i: number, planeSize: number, out: Float32Array | Float64Array): void {
  const src = field.source;
  const s = field.scale;
  const base = i * planeSize;
  if (s === 1) for (let q = 0; q < planeSize; q++) out[q] = src[base + q]!;
  else for (let q = 0; q < planeSize; q++) out[q] = src[base + q]! * s;
}

/** Float array constructor for a precision. */
export function floatArray(precision: 'float32' | 'float64', n: number): Float32Array | Float64Array {
  return precision === 'float32' ? new Float32Array(n) : new Float64Array(n);
}
