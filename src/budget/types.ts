/**
 * Types of the resolution and cost budget. Units cgs unless the name says otherwise.
 */
import type { Eos } from '../physics/eos.js';
import type { JeansConvention } from '../physics/jeans.js';

/** One refinement level of a grid code (or the particle resolution). */
export interface LevelResolution {
  level: number;
  /** Cell size at this level, cm. */
  cellSize: number;
  /** Densest gas resolved with N_J cells per Jeans length at this level, g/cm^3 (EOS-aware). */
  maxResolvedDensity: number;
  /** Gas temperature at that density under the EOS, K. */
  temperature: number;
  /** Jeans mass at that density (the smallest fragment this level resolves), g, in the budget's convention. */
  jeansMass: number;
}

/** Plain-language verdict with the one number that decides it. */
export interface Verdict {
  status: 'resolved' | 'marginal' | 'not resolved';
  /** One sentence: the deciding number and what it is compared with. */
  reason: string;
}

/** The analytic budget (no grid needed). */
export interface BudgetResult {
  code: 'grid' | 'particles';
  levels: LevelResolution[];
  /** Densest gas the planned run resolves, g/cm^3. */
  maxResolvedDensity: number;
  /** Levels needed to resolve the target density (grid code), or null. */
  levelsNeeded: number | null;
  /** Particles needed to resolve the target density or minimum mass (particle code), or null. */
  particlesNeeded: number | null;
  targetDensity: number;
  sinkRadius: number;
  sinkThreshold: number;
  /** Free-fall time at the density where resolution ends, s. */
  freeFallTimeAtLimit: number;
  cost: Record<string, number | string | null>;
  verdict: Verdict;
  warnings: string[];
  // ---- added by the budget module (extensions of the contract) ----
  /** The EOS the criteria were judged with. */
  eos: Eos;
  /** The cloud numbers the budget was computed from (cgs). */
  cloud: BudgetCloud;
  /** The planned run (resolved config values). */
  plan: BudgetPlan;
  /** Jeans-mass convention used for masses (survey.jeans_mass). */
  jeansConvention: JeansConvention;
  /** Density where the Jeans mass equals min_fragment_mass, g/cm^3 (null without min_fragment_mass; Infinity if never). */
  minMassDensity: number | null;
  /** Density the run must resolve: max(targetDensity, minMassDensity), g/cm^3. */
  requiredDensity: number;
  /** Grid code: levels to reach the target density / to resolve min_fragment_mass (null if not asked or not reachable in 40 levels). */
  levelsForTarget: number | null;
  levelsForMinMass: number | null;
  /** Grid code: levels the densest gas present at t = 0 already needs (null for particles). */
  levelsAtStart: number | null;
  /** Particle code: particles to reach the target density / to resolve min_fragment_mass. */
  particlesForTarget: number | null;
  particlesForMinMass: number | null;
  /** Temperature at the density where resolution ends, K. */
  temperatureAtLimit: number;
  /** Jeans mass at the density where resolution ends (smallest fragment resolved), g. */
  jeansMassAtLimit: number;
  /** Smallest EOS Jeans mass and where (null when it keeps falling: isothermal or gamma <= 4/3). */
  minimumJeansMass: { density: number; mass: number } | null;
  /** Sink radius in finest cells (grid) or in smoothing lengths at the threshold (particles). */
  sinkRadiusCells: number;
  /** Typed cost estimate (the `cost` record carries the same numbers). */
  costEstimate: CostEstimate;
  /** Cautions: this is a plan, not a convergence test of the real run. */
  cautions: string[];
}

/** The cloud numbers the analytic budget needs, cgs. */
export interface BudgetCloud {
  mass: number;
  radius: number;
  meanDensity: number;
  peakDensity: number;
  /** Isothermal sound speed at the cloud temperature, cm/s. */
  soundSpeed: number;
  sigma1D: number;
  /** Largest gas speed at t = 0 assumed for the Courant step, cm/s. */
  maxSpeed: number;
  boxSize: number;
  temperature: number;
  mu: number;
  /** Sound speed of the ambient gas, cm/s (hotter than the cloud under pressure balance); optional. */
  ambientSoundSpeed?: number;
  /** Cloud volume, cm^3 (default the sphere of `radius`); optional. */
  volume?: number;
}

/** The planned run, resolved from the config's budget section. */
export interface BudgetPlan {
  baseCells: number;
  levels: number;
  refinementRatio: number;
  cellsPerJeansLength: number;
  courant: number;
  particleCount: number;
  /** Particle mass, g (cloud mass / count). */
  particleMass: number;
  neighbours: number;
  resolvableFactor: number;
  eta: number;
  freeFallTimes: number;
  throughput: number | null;
  /** 3D rms Mach number and the lognormal width sigma_s assumed for the refined-cell estimate. */
  mach: number;
  sigmaS: number;
  magnetic: boolean;
}

/** Cells the refinement would hold at one level as collapse proceeds (rough, see assumptions). */
export interface RefinedLevel {
  level: number;
  cellSize: number;
  /** Density above which this level is needed (the coarser level's limit), g/cm^3. */
  triggerDensity: number;
  /** Cells from the turbulent (lognormal) density PDF above the trigger. */
  turbulentCells: number;
  /** Cells from collapsing cores with r^-2 envelopes. */
  collapseCells: number;
  cells: number;
  /** Courant step at this level, s. */
  timeStep: number;
  /** Updates of this level over the run (own Courant step, subcycled). */
  updates: number;
}

/** The cost estimate, cgs. */
export interface CostEstimate {
  /** Memory of the initial grid (base level) or particle set, bytes. */
  memoryBytes: number;
  /** Conserved variables per cell (or values per particle) counted in memoryBytes. */
  variables: number;
  /** Courant-limited time step at t = 0 on the base grid (or for particles at the mean density), s. */
  timeStep: number;
  /** Run length, s (free_fall_times x initial free-fall time at the mean density). */
  runTime: number;
  initialFreeFallTime: number;
  steps: number;
  /** Base-grid cell updates (or particle updates) over the run. */
  cellUpdates: number;
  /** Rough refined-level estimate (grid code; empty for particles). */
  refinedLevels: RefinedLevel[];
  refinedCells: number;
  refinedCellUpdates: number;
  totalUpdates: number;
  /** Memory of the refined cells at full depth, bytes. */
  refinedMemoryBytes: number;
  /** Finest-level Courant step at the resolution limit, s (grid) or at the limit density (particles). */
  finestTimeStep: number;
  /** Core-hours from the user's throughput, or null without one. */
  coreHours: number | null;
  /** Collapsing centres assumed for the refined-cell estimate. */
  collapseCentres: number;
  assumptions: string[];
}

/** What only a generated grid can tell: the per-cell Jeans number and what it implies. */
export interface GridResolution {
  /** Per cell J = dx / lambda_J (EOS- and convention-independent). */
  jeansNumber: Float32Array;
  /** Smallest number of cells per Jeans length on the grid (1 / max J). */
  jeansCellsMin: number;
  /** Mass fraction in cells with J > 1/N_J. */
  unresolvedMassFraction: number;
  /** Number of cells with J > 1/N_J (would need refinement at t = 0). */
  cellsNeedingRefinement: number;
  /** Smallest and largest stored J over the cells with 0 < J < Infinity, or null when there are none (absent: not recorded). */
  jeansNumberRange?: readonly [number, number] | null;
}
