/**
 * Types of the fragmentation survey: the merge tree of over-dense regions and its verdicts.
 *
 * Grid conventions as in src/grid/grid3.ts. Node numbering: ids 0..n-1 in creation order
 * (leaves before the nodes they merge into), parent -1 for roots. Units cgs.
 */
import type { Grid3 } from '../grid/grid3.js';
import type { Eos } from '../physics/eos.js';
import type { JeansConvention } from '../physics/jeans.js';

/** What the survey reads: a density cube and optional velocity, field and temperature. */
export interface SurveyInput {
  readonly grid: Grid3;
  readonly density: Float32Array;
  readonly velocity?: readonly [Float32Array, Float32Array, Float32Array] | null;
  readonly magnetic?: readonly [Float32Array, Float32Array, Float32Array] | null;
  /** Gas temperature, K: one value, or per cell. */
  readonly temperature: number | Float32Array;
  readonly mu: number;
  readonly eos?: Eos;
}

/** How the survey runs (from the config's survey section, quantities in cgs). */
export interface SurveyOptions {
  readonly jeansConvention: JeansConvention;
  readonly turbulentSupport: boolean;
  readonly requireBound: boolean;
  readonly connectivity: 6 | 26;
  readonly minCells: number;
  readonly minContrast: number;
  /** g */
  readonly minMass: number;
  /** Only cells denser than this are surveyed, g/cm^3. */
  readonly floorDensity: number;
  /** How the floor was chosen, in words (NaN floorDensity: the cube's mean density is used). */
  readonly floorRule?: string;
  /** Self-gravity coarse-graining bound, cells per side. */
  readonly gravityCells: number;
  /** Relative tolerance of the adaptive self-gravity sum (default 0.01). */
  readonly gravityTolerance?: number;
  readonly coreToStarEfficiency: number;
  /** Cloud Mach number and velocity spectral index, for the Padoan & Nordlund model curve (null if unknown). */
  readonly mach: number | null;
  readonly velocitySpectrumIndex: number | null;
  readonly workers?: number;
}

/** State of a node in the Jeans test. */
export type NodeState = 'bound-unstable' | 'unstable' | 'stable';

/** One node of the merge tree; cgs. */
export interface SurveyNode {
  id: number;
  parent: number;
  children: number[];
  cells: number;
  mass: number;
  volume: number;
  peakDensity: number;
  mergeDensity: number;
  meanDensity: number;
  /** Centre of mass, cm. */
  centre: [number, number, number];
  /** One-dimensional velocity dispersion about the node's own centre-of-mass motion, cm/s. */
  sigma1D: number;
  thermalEnergy: number;
  kineticEnergy: number;
  magneticEnergy: number;
  gravitationalEnergy: number;
  virialParameter: number;
  /** E_th / |W| */
  alphaThermal: number;
  bound: boolean;
  jeansMassThermal: number;
  jeansMassTurbulent: number;
  /** The Jeans mass used for the test (turbulent if turbulent support is on). */
  jeansMass: number;
  unstable: boolean;
  candidate: boolean;
  /** Expected fragments this candidate forms (0 for non-candidates). */
  expectedFragments: number;
  state: NodeState;
  /** Radius of the sphere with the node's volume, (3V/(4 pi))^(1/3), cm. */
  effectiveRadius?: number;
  /** Mass-weighted temperature, K. */
  temperature?: number;
  /** (2 (E_kin + E_th) + E_mag) / |W|: below 1 the node is gravity-dominated. */
  virialRatio?: number;
  /** Fine cells per coarse cell side used for the self-gravity sum (1 = none). */
  gravityCoarsening?: number;
  /** Coarse cells per side of the self-gravity grid. */
  gravityCellsPerSide?: number;
  /** Estimated relative error of the gravitational energy from coarse-graining (0: none). */
  gravityError?: number;
  /** Depth in the tree: 0 for roots. */
  depth?: number;
}

/** Power-law fit of a mass spectrum dN/dM ~ M^-slope (Clauset, Shalizi & Newman 2009). */
export interface PowerLawFit {
  slope: number;
  slopeError: number;
  /** g */
  xmin: number;
  /** Number of masses at or above xmin. */
  nTail: number;
  ksDistance: number;
}

/** A model mass-function curve for plots: masses (g) and dN/dlog10 M normalised to the sample. */
export interface ModelCurve {
  name: string;
  masses: number[];
  dndlogm: number[];
}

/** The mass spectrum of fragment candidates with its fit and model overlays. */
export interface MassSpectrum {
  /** Candidate masses, g, descending. */
  masses: number[];
  fit: PowerLawFit | null;
  models: ModelCurve[];
}

/** Result of surveying one cube. */
export interface SurveyResult {
  nodes: SurveyNode[];
  roots: number[];
  candidates: number[];
  unstableNodes: number;
  expectedFragments: number;
  /** How expected fragments are counted, in words, for reports. */
  expectedFragmentsRule: string;
  spectrum: MassSpectrum;
  jeansConvention: JeansConvention;
  /** Per cell: id of the deepest node holding it, -1 outside every node. */
  labels: Int32Array;
  /** Seconds spent per stage, e.g. { tree: 0.4, gravity: 1.2 }. */
  timings: Record<string, number>;
  /** Density floor actually used, g/cm^3, and how it was chosen. */
  floorDensity?: number;
  floorRule?: string;
  /** Significance limits and connectivity used (cgs). */
  limits?: { minCells: number; minContrast: number; minMass: number; connectivity: 6 | 26 };
  /** Thermal Jeans mass at the mean density of the surveyed cells, g (the mass unit of the Padoan & Nordlund curve). */
  referenceJeansMass?: number;
  /** How self-gravity was computed, in words, with its error bound. */
  gravityMethod?: string;
  /** Notes and cautions for the user. */
  notes?: string[];
  /** The options the survey ran with. */
  options?: SurveyOptions;
}
