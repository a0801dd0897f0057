/**
 * Ensembles: the same survey over K seeds, to show how much of a forecast is the seed.
 * Spread is the sample standard deviation (n - 1); pooled candidate-mass percentiles use the
 * nearest-rank rule. Masses in g inside, Msun in the summary block.
 */
import type { SurveyResult } from './types.js';
import { M_SUN } from '../physics/constants.js';
import { sig6 } from './survey-outputs.js';

/** One realization's headline numbers. */
export interface EnsembleMember {
  seed: number;
  candidates: number;
  expectedFragments: number;
  unstableNodes: number;
  /** g */
  totalCandidateMass: number;
  /** g (NaN without candidates) */
  medianCandidateMass: number;
  slope: number | null;
  slopeError: number | null;
}

/** Mean and sample standard deviation. */
export interface MeanSpread { mean: number; std: number; n: number }

/** Statistics over the realizations. */
export interface EnsembleStats {
  members: EnsembleMember[];
  candidates: MeanSpread;
  expectedFragments: MeanSpread;
  medianCandidateMass: MeanSpread;
  totalCandidateMass: MeanSpread;
  slope: MeanSpread;
  /** Pooled candidate masses over all realizations: 16th, 50th, 84th percentiles, g (NaN if none). */
  pooledMassPercentiles: [number, number, number];
}

/** Mean and sample standard deviation of the finite values (NaN mean when none). */
export function meanSpread(xs: readonly number[]): MeanSpread {
  const v = xs.filter((x) => Number.isFinite(x));
  const n = v.length;
  if (n === 0) return { mean: Number.NaN, std: Number.NaN, n: 0 };
  const mean = v.reduce((a, b) => a + b, 0) / n;
  const std = n > 1 ? Math.sqrt(v.reduce((a, b) => a + (b - mean) ** 2, 0) / (n - 1)) : 0;
  return { mean, std, n };
}

function percentile(sorted: readonly number[], q: number): number {
  if (!sorted.length) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))]!;
}

/** Runs runOne for the first k seeds, one after another (each run may use the worker pool itself), and gathers statistics. */
export async function runEnsemble(k: number, runOne: (seed: number) => Promise<SurveyResult>, seeds: number[]): Promise<EnsembleStats> {
  if (!(Number.isInteger(k) && k >= 1)) throw new RangeError(`realizations must be a positive integer, got ${k}`);
  if (seeds.length < k) throw new RangeError(`need ${k} seeds, got ${seeds.length}`);
  const members: EnsembleMember[] = [];
  const pooled: number[] = [];
  for (const seed of seeds.slice(0, k)) {
    const r = await runOne(seed);
    const masses = r.candidates.map((id) => r.nodes[id]!.mass).sort((a, b) => a - b);
    pooled.push(...masses);
    members.push({
      seed, candidates: r.candidates.length, expectedFragments: r.expectedFragments, unstableNodes: r.unstableNodes,
      totalCandidateMass: masses.reduce((a, b) => a + b, 0),
      medianCandidateMass: masses.length ? percentile(masses, 0.5) : Number.NaN,
      slope: r.spectrum.fit?.slope ?? null, slopeError: r.spectrum.fit?.slopeError ?? null,
    });
  }
  pooled.sort((a, b) => a - b);
  return {
    members,
    candidates: meanSpread(members.map((m) => m.candidates)),
    expectedFragments: meanSpread(members.map((m) => m.expectedFragments)),
    medianCandidateMass: meanSpread(members.map((m) => m.medianCandidateMass)),
    totalCandidateMass: meanSpread(members.map((m) => m.totalCandidateMass)),
    slope: meanSpread(members.map((m) => m.slope ?? Number.NaN)),
    pooledMassPercentiles: [percentile(pooled, 0.16), percentile(pooled, 0.5), percentile(pooled, 0.84)],
  };
}

const ms = (x: MeanSpread, scale = 1) => ({ mean: sig6(x.mean / scale), std: sig6(x.std / scale), n: x.n });

/** The `ensemble` block of summary.json. */
export function ensembleSummary(s: EnsembleStats): Record<string, unknown> {
  const m = M_SUN.value;
  return {
    realizations: s.members.length,
    seeds: s.members.map((x) => x.seed),
    spread: 'mean and sample standard deviation over realizations',
    fragment_candidates: ms(s.candidates),
    expected_fragments: ms(s.expectedFragments),
    median_candidate_mass_msun: ms(s.medianCandidateMass, m),
    total_candidate_mass_msun: ms(s.totalCandidateMass, m),
    cmf_slope: ms(s.slope),
    pooled_candidate_mass_percentiles_msun: { p16: sig6(s.pooledMassPercentiles[0] / m), p50: sig6(s.pooledMassPercentiles[1] / m), p84: sig6(s.pooledMassPercentiles[2] / m) },
    members: s.members.map((x) => ({
      seed: x.seed, fragment_candidates: x.candidates, expected_fragments: x.expectedFragments, unstable_nodes: x.unstableNodes,
      total_candidate_mass_msun: sig6(x.totalCandidateMass / m), median_candidate_mass_msun: sig6(x.medianCandidateMass / m),
      cmf_slope: x.slope === null ? null : sig6(x.slope), cmf_slope_error: x.slopeError === null ? null : sig6(x.slopeError),
    })),
  };
}
