/**
 * Per-node energies, Jeans test and fragment candidates, from the node sums (cgs).
 *
 * Energies: thermal (3/2) M c_s^2 at the mass-weighted temperature; kinetic relative to the
 * node's own centre-of-mass motion, (1/2) sum m v^2 - |sum m v|^2 / (2M); magnetic sum
 * B^2 dV / (8 pi) over the node's cells; gravitational from the node's own mass distribution
 * (self-gravity.ts). sigma_1D = sqrt(2 E_kin / (3 M)). Bound: E_th + E_kin + E_mag + W < 0.
 * Virial parameter 5 sigma_1D^2 R / (G M) (Bertoldi & McKee 1992) with R the radius of the
 * sphere of the node's volume; alpha = E_th / |W|.
 * Jeans test: M_J at the node's mean density in the selected convention (physics/jeans.ts),
 * thermal (c_s) and with turbulent support (c_eff^2 = c_s^2 + sigma_1D^2, common practice).
 * Unstable: M > M_J (the turbulent one when turbulent support is on), and bound if requireBound.
 * Candidates: unstable nodes with no unstable descendant. Expected fragments: see EXPECTED_RULE.
 */
import type { SurveyNode, SurveyOptions } from './types.js';
import type { MergeTree } from './merge-tree.js';
import { CH, NODE_CHANNELS } from './node-moments.js';
import { soundSpeed } from '../physics/sound-speed.js';
import { thermalEnergy, virialParameter, energyRatio } from '../physics/virial.js';
import { jeansMass, effectiveSoundSpeed } from '../physics/jeans.js';

/** The expected-fragments rule, in words. */
export const EXPECTED_RULE = 'each fragment candidate counts floor(M / M_J) fragments, at least 1 (M_J the Jeans mass used for the test, at the candidate\'s mean density)';

/** Expected fragments of one candidate of mass M (g) and Jeans mass M_J (g): max(1, floor(M/M_J)). */
export function expectedFragmentsOf(mass: number, jeans: number): number {
  return Math.max(1, Math.floor(mass / jeans));
}

/** Builds the SurveyNode list from tree, sums (NODE_CHANNELS per node), gravitational energies (erg) and coarse-graining. */
export function nodeVerdicts(
  tree: MergeTree,
  sums: Float64Array,
  gravity: { energy: Float64Array; factor: Int32Array; cellsPerSide: Int32Array; relativeError: Float64Array },
  cellVolume: number,
  mu: number,
  options: Pick<SurveyOptions, 'jeansConvention' | 'turbulentSupport' | 'requireBound'>,
): SurveyNode[] {
  const nodes: SurveyNode[] = [];
  for (let id = 0; id < tree.count; id++) {
    const b = id * NODE_CHANNELS;
    const M = sums[b + CH.mass]!;
    const volume = tree.cells[id]! * cellVolume;
    const meanDensity = M / volume;
    const centre: [number, number, number] = [sums[b + CH.mx]! / M, sums[b + CH.my]! / M, sums[b + CH.mz]! / M];
    const p2 = sums[b + CH.px]! ** 2 + sums[b + CH.py]! ** 2 + sums[b + CH.pz]! ** 2;
    const kinetic = Math.max(0, 0.5 * sums[b + CH.mv2]! - (0.5 * p2) / M);
    const sigma1D = Math.sqrt((2 * kinetic) / (3 * M));
    const temperature = sums[b + CH.mT]! / M;
    const cs = soundSpeed(temperature, mu);
    const thermal = thermalEnergy(M, cs);
    const magnetic = sums[b + CH.emag]!;
    const W = gravity.energy[id]!;
    const radius = Math.cbrt((3 * volume) / (4 * Math.PI));
    const bound = thermal + kinetic + magnetic + W < 0;
    const mjThermal = jeansMass(cs, meanDensity, options.jeansConvention);
    const mjTurb = jeansMass(effectiveSoundSpeed(cs, sigma1D), meanDensity, options.jeansConvention);
    const mj = options.turbulentSupport ? mjTurb : mjThermal;
    const unstable = M > mj && (!options.requireBound || bound);
    nodes.push({
      id, parent: tree.parent[id]!, children: tree.children[id]!.slice(), cells: tree.cells[id]!, mass: M, volume,
      peakDensity: tree.peak[id]!, mergeDensity: tree.mergeDensity[id]!, meanDensity, centre, sigma1D,
      thermalEnergy: thermal, kineticEnergy: kinetic, magneticEnergy: magnetic, gravitationalEnergy: W,
      virialParameter: virialParameter(sigma1D, radius, M),
      alphaThermal: W < 0 ? energyRatio(thermal, W) : Infinity,
      bound, jeansMassThermal: mjThermal, jeansMassTurbulent: mjTurb, jeansMass: mj, unstable,
      candidate: false, expectedFragments: 0, state: unstable ? (bound ? 'bound-unstable' : 'unstable') : 'stable',
      effectiveRadius: radius, temperature,
      virialRatio: W < 0 ? (2 * (kinetic + thermal) + magnetic) / -W : Infinity,
      gravityCoarsening: gravity.factor[id]!, gravityCellsPerSide: gravity.cellsPerSide[id]!, gravityError: gravity.relativeError[id]!, depth: 0,
    });
  }
  // depth top-down (parents have larger ids)
  for (let id = tree.count - 1; id >= 0; id--) {
    const p = nodes[id]!.parent;
    nodes[id]!.depth = p < 0 ? 0 : nodes[p]!.depth! + 1;
  }
  // candidates: unstable with no unstable descendant (children have smaller ids)
  const unstableBelow = new Uint8Array(tree.count);
  for (let id = 0; id < tree.count; id++) {
    const n = nodes[id]!;
    if (n.unstable && !unstableBelow[id]) {
      n.candidate = true;
      n.expectedFragments = expectedFragmentsOf(n.mass, n.jeansMass);
    }
    if ((n.unstable || unstableBelow[id]) && n.parent >= 0) unstableBelow[n.parent] = 1;
  }
  return nodes;
}
