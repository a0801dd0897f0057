/**
 * Cost of the planned run, cgs: memory of the initial grid or particle set, the Courant-limited
 * time step (Courant, Friedrichs & Lewy 1928), steps to the requested number of initial free-fall
 * times, cell or particle updates, core-hours from the user's measured throughput (never
 * invented), and a rough count of refined cells as collapse proceeds, with its assumptions.
 */
import type { Eos } from '../physics/eos.js';
import { eosSoundSpeed } from '../physics/eos.js';
import { courantTimeStep } from '../physics/courant.js';
import { singularIsothermalSphereRadius } from '../physics/collapse-profile.js';
import { freeFallTime } from '../physics/free-fall.js';
import { jeansMass, type JeansConvention } from '../physics/jeans.js';
import { lognormalVolumeFractionAbove } from '../physics/lognormal-pdf.js';
import { smoothingLength } from '../physics/resolution.js';
import { levelCellSize, levelMaxDensity } from './grid-levels.js';
import type { BudgetCloud, BudgetPlan, CostEstimate, RefinedLevel } from './types.js';

/** Bytes per stored value of the target code (double precision, common practice). */
export const BYTES_PER_VALUE = 8;

/** Values per cell: density, 3 momenta, energy (+3 field components with a magnetic field). */
export function gridVariables(plan: BudgetPlan): number {
  return 5 + (plan.magnetic ? 3 : 0);
}

/** Values per particle: position 3, velocity 3, mass, smoothing length, density, internal energy (+3 field). */
export function particleVariables(plan: BudgetPlan): number {
  return 10 + (plan.magnetic ? 3 : 0);
}

/** Fastest signal speed at t = 0, cm/s: the cloud's sound speed plus its largest speed, or the ambient sound speed. */
function signalSpeed(cloud: BudgetCloud): { cs: number; v: number } {
  const amb = cloud.ambientSoundSpeed ?? 0;
  return cloud.soundSpeed + cloud.maxSpeed >= amb ? { cs: cloud.soundSpeed, v: cloud.maxSpeed } : { cs: amb, v: 0 };
}

/** Collapsing centres assumed for the refined-cell estimate: the cloud's thermal Jeans masses at its mean density, at least 1. */
export function collapseCentres(cloud: BudgetCloud, convention: JeansConvention): number {
  return Math.max(1, Math.floor(cloud.mass / jeansMass(cloud.soundSpeed, cloud.meanDensity, convention)));
}

/** The cost estimate of a grid-code run with `plan.levels` refinement levels. */
export function gridCost(plan: BudgetPlan, cloud: BudgetCloud, eos: Eos, convention: JeansConvention, limitDensity: number): CostEstimate {
  const vars = gridVariables(plan);
  const baseCells = plan.baseCells ** 3;
  const dx0 = levelCellSize(plan, cloud.boxSize, 0);
  const sig = signalSpeed(cloud);
  const timeStep = courantTimeStep(dx0, sig.cs, sig.v, plan.courant);
  const tff0 = freeFallTime(cloud.meanDensity);
  const runTime = plan.freeFallTimes * tff0;
  const steps = Math.ceil(runTime / timeStep);
  const centres = collapseCentres(cloud, convention);
  const cloudVolume = cloud.volume ?? (4 / 3) * Math.PI * cloud.radius ** 3;
  const refinedLevels: RefinedLevel[] = [];
  let refinedCells = 0;
  let refinedUpdates = 0;
  for (let l = 1; l <= plan.levels; l++) {
    const dx = levelCellSize(plan, cloud.boxSize, l);
    const trigger = levelMaxDensity(plan, cloud, eos, l - 1);
    const boxCells = (cloud.boxSize / dx) ** 3;
    const turbulent = (cloudVolume * lognormalVolumeFractionAbove(trigger / cloud.meanDensity, plan.sigmaS)) / dx ** 3;
    const r = singularIsothermalSphereRadius(eosSoundSpeed(eos, cloud.soundSpeed, trigger), trigger);
    const collapse = centres * (4 / 3) * Math.PI * (r / dx) ** 3;
    const cells = Math.min(boxCells, turbulent + collapse);
    const rhoTop = levelMaxDensity(plan, cloud, eos, l);
    const dt = courantTimeStep(dx, eosSoundSpeed(eos, cloud.soundSpeed, Number.isFinite(rhoTop) ? rhoTop : trigger), cloud.maxSpeed, plan.courant);
    const updates = cells * Math.ceil(runTime / dt);
    refinedLevels.push({ level: l, cellSize: dx, triggerDensity: trigger, turbulentCells: turbulent, collapseCells: collapse, cells, timeStep: dt, updates });
    refinedCells += cells;
    refinedUpdates += updates;
  }
  const dxMin = levelCellSize(plan, cloud.boxSize, plan.levels);
  const csLimit = eosSoundSpeed(eos, cloud.soundSpeed, Number.isFinite(limitDensity) ? limitDensity : cloud.meanDensity);
  const cellUpdates = baseCells * steps;
  const total = cellUpdates + refinedUpdates;
  const assumptions = [
    `memory: ${vars} double-precision values per cell (density, momentum, energy${plan.magnetic ? ', field' : ''}), one copy; codes need a few times this for work arrays and ghost zones`,
    `time step: Courant number ${plan.courant} x cell size / (sound speed + largest speed at t = 0${cloud.ambientSoundSpeed ? ', or the ambient sound speed if larger' : ''}); collapse speeds grow later`,
    `run length: ${plan.freeFallTimes} free-fall time(s) at the initial mean density`,
  ];
  if (plan.levels > 0) {
    assumptions.push(
      `refined cells: at each level, the cloud volume denser than the coarser level's resolved density under a lognormal density PDF of width sigma_s = ${plan.sigmaS.toFixed(2)} (Padoan, Nordlund & Jones 1997), plus ${centres} collapsing core(s) (one per thermal Jeans mass of the cloud) each with an r^-2 envelope (singular isothermal sphere, Shu 1977) refined where it outgrows the coarser level; refined cells counted as present for the whole run, each level advancing at its own Courant step; AMR block and buffer overheads and the power-law density tail that gravity adds are not included, so this is likely a lower bound`,
    );
  }
  assumptions.push(plan.throughput === null
    ? 'core-hours: not computed; give budget.throughput (measured cell updates per core per second of your code) to get them'
    : `core-hours: total updates / ${plan.throughput} updates per core per second (your throughput)`);
  return {
    memoryBytes: baseCells * vars * BYTES_PER_VALUE,
    variables: vars,
    timeStep,
    runTime,
    initialFreeFallTime: tff0,
    steps,
    cellUpdates,
    refinedLevels,
    refinedCells,
    refinedCellUpdates: refinedUpdates,
    totalUpdates: total,
    refinedMemoryBytes: refinedCells * vars * BYTES_PER_VALUE,
    finestTimeStep: courantTimeStep(dxMin, csLimit, cloud.maxSpeed, plan.courant),
    coreHours: plan.throughput === null ? null : total / plan.throughput / 3600,
    collapseCentres: centres,
    assumptions,
  };
}

/** The cost estimate of a particle-code run (one global time step set by the densest gas at t = 0). */
export function particleCost(plan: BudgetPlan, cloud: BudgetCloud, eos: Eos, convention: JeansConvention, limitDensity: number): CostEstimate {
  const vars = particleVariables(plan);
  const h0 = smoothingLength(plan.particleMass, cloud.peakDensity, plan.eta);
  const timeStep = courantTimeStep(h0, cloud.soundSpeed, cloud.maxSpeed, plan.courant);
  const tff0 = freeFallTime(cloud.meanDensity);
  const runTime = plan.freeFallTimes * tff0;
  const steps = Math.ceil(runTime / timeStep);
  const updates = plan.particleCount * steps;
  const rhoLim = Number.isFinite(limitDensity) ? limitDensity : cloud.peakDensity;
  const hMin = smoothingLength(plan.particleMass, rhoLim, plan.eta);
  return {
    memoryBytes: plan.particleCount * vars * BYTES_PER_VALUE,
    variables: vars,
    timeStep,
    runTime,
    initialFreeFallTime: tff0,
    steps,
    cellUpdates: updates,
    refinedLevels: [],
    refinedCells: 0,
    refinedCellUpdates: 0,
    totalUpdates: updates,
    refinedMemoryBytes: 0,
    finestTimeStep: courantTimeStep(hMin, eosSoundSpeed(eos, cloud.soundSpeed, rhoLim), cloud.maxSpeed, plan.courant),
    coreHours: plan.throughput === null ? null : updates / plan.throughput / 3600,
    collapseCentres: collapseCentres(cloud, convention),
    assumptions: [
      `memory: ${vars} double-precision values per particle (position, velocity, mass, smoothing length, density, internal energy${plan.magnetic ? ', field' : ''}), one copy; tree and neighbour lists add more`,
      `time step: Courant number ${plan.courant} x smoothing length h = ${plan.eta} (m/rho)^(1/3) at the peak density (Price 2012) / (sound speed + largest speed at t = 0)`,
      `updates: every particle at every global step over ${plan.freeFallTimes} initial free-fall time(s); individual time steps cut this a lot, collapse raises it`,
      plan.throughput === null
        ? 'core-hours: not computed; give budget.throughput (measured particle updates per core per second of your code) to get them'
        : `core-hours: updates / ${plan.throughput} updates per core per second (your throughput)`,
    ],
  };
}
