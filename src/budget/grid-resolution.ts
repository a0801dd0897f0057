/**
 * The per-cell Jeans number of a density cube: J = dx / lambda_J with lambda_J at the gas
 * temperature times the EOS factor (Truelove et al. 1997: resolved when J <= 1/N_J).
 *
 * Grid conventions as in src/grid/grid3.ts: shape (nx, ny, nz), C order, index (i*ny + j)*nz + k,
 * i along x, cell-centred, box [-L/2, L/2)^3; density g/cm^3, temperature K, dx cm.
 * One pass, no allocation per cell; sums in Float64.
 */
import { cellCount, cellSize, type Grid3 } from '../grid/grid3.js';
import { forCellBlocks } from '../grid/cell-blocks.js';
import { eosTemperatureFactor, type Eos } from '../physics/eos.js';
import { jeansNumber } from '../physics/resolution.js';
import { soundSpeed } from '../physics/sound-speed.js';
import type { GridResolution } from './types.js';

/** Per-cell Jeans number map (into jmapOut when given; temperature: per-cell gas temperature in K, or a base T0 that follows the EOS), 1/max J, unresolved mass fraction (J > 1/N_J) and cells needing refinement. */
export function gridResolution(grid: Grid3, density: Float32Array, temperature: number | Float32Array, mu: number, eos: Eos, cellsPerJeansLength: number, jmapOut?: Float32Array): GridResolution {
  const n = cellCount(grid);
  if (density.length !== n) throw new RangeError(`density has ${density.length} values, the grid ${n}`);
  if (typeof temperature !== 'number' && temperature.length !== n) throw new RangeError(`temperature has ${temperature.length} values, the grid ${n}`);
  if (!(cellsPerJeansLength > 0)) throw new RangeError(`cells per Jeans length must be positive, got ${cellsPerJeansLength}`);
  const dx = cellSize(grid);
  if (jmapOut && jmapOut.length !== n) throw new RangeError(`jmapOut has ${jmapOut.length} values, the grid ${n}`);
  const jmap = jmapOut ?? new Float32Array(n);
  const limit = 1 / cellsPerJeansLength;
  // J = dx / lambda_J is proportional to sqrt(rho / T) (c_s^2 ~ T): J = J(rho = 1, T = 1 K) sqrt(rho / T).
  const j1 = jeansNumber(dx, soundSpeed(1, mu), 1);
  const scalarT = typeof temperature === 'number' ? temperature : 0;
  const field = typeof temperature === 'number' ? null : temperature;
  // A per-cell temperature is the gas temperature (the generator already applied the EOS);
  // a scalar is the base temperature T0 and follows the EOS here.
  const baro = eos.kind === 'barotropic' && field === null;
  const jUniform = field === null && !baro ? j1 / Math.sqrt(scalarT) : 0;
  // running values: last rho, last T0, last J, max J, mass, unresolved mass, count, smallest and
  // largest stored finite J > 0 (see jeansRows)
  const run = Float64Array.of(Number.NaN, Number.NaN, 0, 0, 0, 0, 0, Infinity, -Infinity);
  forCellBlocks(n, (a, b) => jeansRows(a, b, density, field, scalarT, baro ? eos : null, jUniform, j1, limit, jmap, run));
  const maxJ = run[3]!, mass = run[4]!, unresolvedMass = run[5]!, count = run[6]!;
  return {
    jeansNumber: jmap,
    jeansCellsMin: maxJ > 0 ? 1 / maxJ : Infinity,
    unresolvedMassFraction: mass > 0 ? unresolvedMass / mass : 0,
    cellsNeedingRefinement: count,
    jeansNumberRange: run[8]! >= run[7]! ? [run[7]!, run[8]!] : null,
  };
}

/** +Infinity and +0 read as float64 values (literals in the loop make V8 box each J). */
const FLOAT_CONSTANTS = Float64Array.of(Infinity, 0);

/** J of cells [a, b) into jmap (see gridResolution; a block kernel: src/grid/cell-blocks.ts); run: last rho, last T0, last J, max J, mass, unresolved mass, count, smallest and largest stored finite J > 0, updated. */
function jeansRows(
  a: number, b: number, density: Float32Array, field: Float32Array | null, scalarT: number, eos: Eos | null,
  jUniform: number, j1: number, limit: number, jmap: Float32Array, run: Float64Array,
): void {
  const inf = FLOAT_CONSTANTS[0]!, zero = FLOAT_CONSTANTS[1]!;
  let lastRho = run[0]!, lastT = run[1]!, lastJ = run[2]!, maxJ = run[3]!, mass = run[4]!, unresolvedMass = run[5]!, count = run[6]!;
  let lo = run[7]!, hi = run[8]!;
  for (let i = a; i < b; i++) {
    const rho = density[i]!;
    let j: number;
    if (!(rho > 0)) j = zero;
    else if (jUniform > 0) j = jUniform * Math.sqrt(rho);
    else {
      const t0 = field === null ? scalarT : field[i]!;
      // runs of equal (rho, T), as in a uniform ambient medium, reuse the value (the same result)
      if (rho === lastRho && t0 === lastT) j = lastJ;
      else {
        const t = t0 * (eos !== null ? eosTemperatureFactor(eos, rho) : 1);
        j = t > 0 ? j1 * Math.sqrt(rho / t) : inf;
        lastRho = rho; lastT = t0; lastJ = j;
      }
    }
    jmap[i] = j;
    // the stored (Float32) value's range over 0 < J < Infinity, as the Jeans histogram takes it
    const v = Math.fround(j);
    if (v > 0 && v !== inf) { if (v < lo) lo = v; if (v > hi) hi = v; }
    if (rho > 0) mass += rho;
    if (j > maxJ) maxJ = j;
    if (j > limit) {
      unresolvedMass += rho;
      count++;
    }
  }
  run[0] = lastRho; run[1] = lastT; run[2] = lastJ; run[3] = maxJ; run[4] = mass; run[5] = unresolvedMass; run[6] = count;
  run[7] = lo; run[8] = hi;
}
