/** The plain-language budget block printed in the terminal: verdict first, then numbers, assumptions and cautions. */
import { toUnit } from '../physics/units.js';
import { fmt, fmtBytes } from './format.js';
import { h2NumberDensity } from '../physics/number-density.js';
import type { BudgetResult, GridResolution } from './types.js';

function pad(s: string, n: number): string {
  return s.length >= n ? s : ' '.repeat(n - s.length) + s;
}

/** Text block of the budget (and, with a grid, its t = 0 Jeans-number check). */
export function budgetText(b: BudgetResult, g: GridResolution | null = null): string {
  const p = b.plan;
  const c = b.cloud;
  const cost = b.costEstimate;
  const L: string[] = [];
  L.push(`Verdict: ${b.verdict.status.toUpperCase()} - ${b.verdict.reason}.`);
  const eos = b.eos.kind === 'isothermal' ? 'isothermal' : `barotropic, stiffening at ${fmt(b.eos.criticalDensity)} g/cm^3, gamma ${fmt(b.eos.gamma)} (T = T0 [1 + (rho/rho_c)^(gamma-1)])`;
  if (b.code === 'grid') {
    L.push(`Target code: grid, ${p.baseCells}^3 base cells, ${p.levels} refinement level(s) at ratio ${p.refinementRatio}, N_J = ${fmt(p.cellsPerJeansLength)} cells per Jeans length (Truelove et al. 1997). EOS: ${eos}.`);
  } else {
    L.push(`Target code: particles, ${fmt(p.particleCount)} particles of ${fmt(toUnit(p.particleMass, 'Msun'))} Msun, ${p.neighbours} neighbours, resolvable mass ${fmt(p.resolvableFactor)} x N_neigh x m (Bate & Burkert 1997). EOS: ${eos}.`);
  }
  L.push(`Cloud: ${fmt(toUnit(c.mass, 'Msun'))} Msun, R = ${fmt(toUnit(c.radius, 'pc'))} pc, T = ${fmt(c.temperature)} K, mean density ${fmt(c.meanDensity)} g/cm^3 (n(H2) ${fmt(h2NumberDensity(c.meanDensity))} cm^-3), peak ${fmt(c.peakDensity)} g/cm^3, c_s = ${fmt(toUnit(c.soundSpeed, 'km/s'))} km/s, Mach ${fmt(p.mach)}, box ${fmt(toUnit(c.boxSize, 'pc'))} pc.`);
  L.push('');
  if (b.code === 'grid') {
    L.push('Resolution by level (judged at the EOS temperature at each density):');
    L.push(`  ${pad('level', 5)} ${pad('cell [au]', 11)} ${pad('max rho [g/cm^3]', 17)} ${pad('n(H2) [cm^-3]', 14)} ${pad('T [K]', 7)} ${pad('M_J [Msun]', 11)}`);
    for (const l of b.levels) {
      L.push(`  ${pad(String(l.level), 5)} ${pad(fmt(toUnit(l.cellSize, 'au')), 11)} ${pad(fmt(l.maxResolvedDensity), 17)} ${pad(fmt(h2NumberDensity(l.maxResolvedDensity)), 14)} ${pad(fmt(l.temperature), 7)} ${pad(fmt(toUnit(l.jeansMass, 'Msun')), 11)}`);
    }
  } else {
    const l = b.levels[0]!;
    if (!Number.isFinite(l.maxResolvedDensity)) L.push(`Resolution: every density is resolved: the EOS Jeans mass never falls to the resolvable ${fmt(toUnit(l.jeansMass, 'Msun'))} Msun.`);
    else L.push(`Resolution: densest gas resolved ${fmt(l.maxResolvedDensity)} g/cm^3 (n(H2) ${fmt(h2NumberDensity(l.maxResolvedDensity))} cm^-3, T ${fmt(l.temperature)} K), where the Jeans mass falls to the resolvable ${fmt(toUnit(l.jeansMass, 'Msun'))} Msun; smoothing length there ${fmt(toUnit(l.cellSize, 'au'))} au.`);
  }
  const needUnit = b.code === 'grid' ? 'level(s)' : 'particles';
  const forTarget = b.code === 'grid' ? b.levelsForTarget : b.particlesForTarget;
  const forMass = b.code === 'grid' ? b.levelsForMinMass : b.particlesForMinMass;
  L.push(`Needed: target density ${fmt(b.targetDensity)} g/cm^3 -> ${forTarget === null ? 'not reachable' : `${fmt(forTarget)} ${needUnit}`}.`);
  if (b.minMassDensity !== null) {
    L.push(`        fragments down to the minimum mass: Jeans mass reaches it at ${fmt(b.minMassDensity)} g/cm^3 -> ${forMass === null ? 'not reachable' : `${fmt(forMass)} ${needUnit}`}.`);
  }
  if (b.minimumJeansMass) L.push(`        the EOS sets a smallest Jeans mass of ${fmt(toUnit(b.minimumJeansMass.mass, 'Msun'))} Msun at ${fmt(b.minimumJeansMass.density)} g/cm^3.`);
  const needed = b.code === 'grid' ? b.levelsNeeded : b.particlesNeeded;
  const planned = b.code === 'grid' ? p.levels : p.particleCount;
  if (b.code === 'grid' && b.levelsAtStart !== null && b.levelsAtStart > 0) L.push(`        the densest gas at t = 0 (${fmt(c.peakDensity)} g/cm^3) already needs ${b.levelsAtStart} level(s).`);
  L.push(`        fewest that meet every requirement: ${needed === null ? 'none' : `${fmt(needed)} ${needUnit}`} (planned: ${fmt(planned)}).`);
  L.push(b.code === 'grid'
    ? `Sinks: accretion radius ${fmt(b.sinkRadiusCells)} finest cells = ${fmt(toUnit(b.sinkRadius, 'au'))} au, threshold ${fmt(b.sinkThreshold)} g/cm^3 (Federrath et al. 2010).`
    : `Sinks: threshold ${fmt(b.sinkThreshold)} g/cm^3 (${Number.isFinite(b.maxResolvedDensity) ? 'the resolution limit' : 'the density the run needs; resolution never ends'}), accretion radius ${fmt(b.sinkRadiusCells)} h = ${fmt(toUnit(b.sinkRadius, 'au'))} au.`);
  if (!Number.isFinite(b.maxResolvedDensity)) L.push('The run never stops resolving under this EOS (the resolution limit is not reached at any density).');
  else L.push(`The run stops resolving above ${fmt(b.maxResolvedDensity)} g/cm^3 (T = ${fmt(b.temperatureAtLimit)} K); free-fall time there ${fmt(toUnit(b.freeFallTimeAtLimit, 'yr'))} yr; smallest fragment resolved ${fmt(toUnit(b.jeansMassAtLimit, 'Msun'))} Msun.`);
  if (g) {
    L.push(`At t = 0 on the generated grid: at least ${fmt(g.jeansCellsMin)} cells per Jeans length; ${fmt(100 * g.unresolvedMassFraction)} % of the mass (${fmt(g.cellsNeedingRefinement)} cells) has fewer than ${fmt(p.cellsPerJeansLength)} and needs refinement.`);
  }
  L.push('');
  L.push('Cost:');
  L.push(`  memory of the initial ${b.code === 'grid' ? 'grid' : 'particles'}: ${fmtBytes(cost.memoryBytes)} (${cost.variables} doubles per ${b.code === 'grid' ? 'cell' : 'particle'})`);
  L.push(`  time step ${fmt(toUnit(cost.timeStep, 'yr'))} yr (Courant ${fmt(p.courant)}); ${fmt(cost.steps)} steps to ${fmt(p.freeFallTimes)} initial free-fall time(s) of ${fmt(toUnit(cost.initialFreeFallTime, 'Myr'))} Myr`);
  L.push(`  ${b.code === 'grid' ? 'base-grid cell' : 'particle'} updates: ${fmt(cost.cellUpdates)}`);
  if (b.code === 'grid' && p.levels > 0) {
    L.push(`  refined cells (rough, at full depth): ${fmt(cost.refinedCells)} (${fmtBytes(cost.refinedMemoryBytes)}); their updates ${fmt(cost.refinedCellUpdates)}; finest time step ${fmt(toUnit(cost.finestTimeStep, 'yr'))} yr`);
  } else {
    L.push(`  time step at the resolution limit: ${fmt(toUnit(cost.finestTimeStep, 'yr'))} yr`);
  }
  L.push(`  core-hours: ${cost.coreHours === null ? 'not estimated (no throughput given; set budget.throughput to your code\'s measured updates per core per second)' : fmt(cost.coreHours)}`);
  L.push('Assumptions:');
  for (const a of cost.assumptions) L.push(`  - ${a}`);
  if (b.warnings.length) {
    L.push('Warnings:');
    for (const w of b.warnings) L.push(`  ! ${w}`);
  }
  L.push('Cautions:');
  for (const w of b.cautions) L.push(`  * ${w}`);
  return `${L.join('\n')}\n`;
}
