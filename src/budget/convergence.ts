/**
 * Convergence of a resolution ladder: the same cloud (phase-consistent seed) generated and
 * surveyed at increasing resolution. Criterion, between the two finest rungs:
 * - fragment count: the candidate counts differ by at most max(1, 10 %) of the finer count;
 * - mass spectrum: the two-sample Kolmogorov-Smirnov distance of the candidate masses stays
 *   below its 5 % critical value c(0.05) sqrt((n+m)/(n m)), c(0.05) = 1.358 (Smirnov 1948;
 *   asymptotic Kolmogorov distribution), judged only with at least 3 masses in each.
 * Masses in g.
 */

/** Asymptotic critical value c(alpha) of the two-sample KS test at alpha = 0.05 (Smirnov 1948). */
export const KS_C_05 = 1.358;
/** Relative tolerance on the fragment count between the two finest rungs. */
export const COUNT_TOLERANCE = 0.1;
/** Fewest masses per rung for the spectrum comparison. */
export const MIN_MASSES_FOR_SPECTRUM = 3;

/** Two-sample Kolmogorov-Smirnov distance D = sup |F_a - F_b| of two samples (dimensionless; 0 if either is empty). */
export function ksTwoSample(a: readonly number[], b: readonly number[]): number {
  if (a.length === 0 || b.length === 0) return 0;
  const x = Float64Array.from(a).sort();
  const y = Float64Array.from(b).sort();
  let i = 0;
  let j = 0;
  let d = 0;
  while (i < x.length && j < y.length) {
    const v = Math.min(x[i]!, y[j]!);
    while (i < x.length && x[i]! <= v) i++;
    while (j < y.length && y[j]! <= v) j++;
    d = Math.max(d, Math.abs(i / x.length - j / y.length));
  }
  return d;
}

/** Critical KS distance at 5 % for sample sizes n and m (dimensionless). */
export function ksCritical05(n: number, m: number): number {
  return KS_C_05 * Math.sqrt((n + m) / (n * m));
}

/** What the ladder needs from a survey (a SurveyResult satisfies it). */
export interface LadderSurvey {
  readonly candidates: readonly number[];
  readonly expectedFragments: number;
  readonly spectrum: { readonly masses: readonly number[]; readonly fit: { readonly slope: number } | null };
}

/** The convergence judgement of a ladder. */
export interface LadderConvergence {
  /** true / false, or null when the spectrum could not be judged and the count converged. */
  converged: boolean | null;
  countConverged: boolean;
  /** Candidate counts of the two finest rungs. */
  counts: [number, number];
  spectrumConverged: boolean | null;
  ksDistance: number | null;
  ksCritical: number | null;
  criterion: string;
  reason: string;
}

/** Judges convergence from surveys ordered coarse to fine (at least two). */
export function ladderConvergence(surveys: readonly LadderSurvey[]): LadderConvergence {
  const criterion = `between the two finest rungs: fragment-candidate counts within max(1, ${COUNT_TOLERANCE * 100} %) and candidate masses consistent by a two-sample Kolmogorov-Smirnov test at the 5 % level (critical distance ${KS_C_05} sqrt((n+m)/(nm)), Smirnov 1948; needs >= ${MIN_MASSES_FOR_SPECTRUM} masses each)`;
  if (surveys.length < 2) {
    return { converged: null, countConverged: false, counts: [0, 0], spectrumConverged: null, ksDistance: null, ksCritical: null, criterion, reason: 'fewer than two rungs: nothing to compare' };
  }
  const a = surveys[surveys.length - 2]!;
  const b = surveys[surveys.length - 1]!;
  const na = a.candidates.length;
  const nb = b.candidates.length;
  const countConverged = Math.abs(nb - na) <= Math.max(1, COUNT_TOLERANCE * nb);
  let spectrumConverged: boolean | null = null;
  let ksDistance: number | null = null;
  let ksCritical: number | null = null;
  const ma = a.spectrum.masses;
  const mb = b.spectrum.masses;
  if (ma.length >= MIN_MASSES_FOR_SPECTRUM && mb.length >= MIN_MASSES_FOR_SPECTRUM) {
    ksDistance = ksTwoSample(ma, mb);
    ksCritical = ksCritical05(ma.length, mb.length);
    spectrumConverged = ksDistance <= ksCritical;
  }
  const converged = !countConverged ? false : spectrumConverged;
  const parts = [`fragment candidates ${na} -> ${nb} (${countConverged ? 'within' : 'outside'} tolerance)`];
  parts.push(spectrumConverged === null
    ? 'too few fragments to compare mass spectra'
    : `mass spectra KS distance ${ksDistance!.toFixed(3)} ${spectrumConverged ? '<=' : '>'} critical ${ksCritical!.toFixed(3)}`);
  return { converged, countConverged, counts: [na, nb], spectrumConverged, ksDistance, ksCritical, criterion, reason: parts.join('; ') };
}
