/**
 * Types of the resolution and cost budget. Units cgs unless the name says otherwise.
 */

/** One refinement level of a grid code (or the particle resolution). */
export interface LevelResolution {
  level: number;
  /** Cell size at this level, cm. */
  cellSize: number;
  /** Densest gas resolved with N_J cells per Jeans length at this level, g/cm^3 (EOS-aware). */
  maxResolvedDensity: number;
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
}
