/**
 * Mass spectrum of fragment candidates with its power-law fit and model overlays.
 *
 * Curves are dN/dlog10 M against core mass M (g), each normalised so that its integral over
 * the sampled mass range equals the number of candidates (1 when there are none):
 * - the Padoan & Nordlund (2002) core mass function at the cloud's Mach number and velocity
 *   spectral index (beta = n - 2 for P(k) ~ k^-n), mass unit the thermal Jeans mass at the
 *   mean density of the surveyed gas;
 * - the Salpeter (1955), Kroupa (2001) and Chabrier (2003, system form) stellar IMFs moved to
 *   core masses by the core-to-star efficiency, M_core = M_star / efficiency (a CMF that is the
 *   IMF shifted in mass, as Alves, Lombardi & Lada 2007 found);
 * - the stellar spectrum the candidates imply, efficiency x M, as a histogram (0.25 dex bins).
 */
import type { MassSpectrum, ModelCurve } from './types.js';
import { fitPowerLaw } from './power-law-fit.js';
import { M_SUN } from '../physics/constants.js';
import { salpeterImf, kroupaImf, chabrierImf, padoanNordlundCmf, energySpectrumIndex } from '../physics/mass-functions.js';

const POINTS = 60;

function logGrid(lo: number, hi: number, n: number): number[] {
  const a = Math.log10(lo), b = Math.log10(hi);
  return Array.from({ length: n }, (_, i) => 10 ** (a + ((b - a) * i) / (n - 1)));
}

/** A model curve normalised to `total` objects between lo and hi (g); shape f(M in g) gives dN/dlog10 M up to a constant. */
export function normalisedCurve(name: string, shape: (m: number) => number, plotLo: number, plotHi: number, lo: number, hi: number, total: number): ModelCurve | null {
  const fine = logGrid(lo, hi, 400);
  let integral = 0;
  const dl = (Math.log10(hi) - Math.log10(lo)) / (fine.length - 1);
  for (let i = 0; i < fine.length; i++) integral += shape(fine[i]!) * dl * (i === 0 || i === fine.length - 1 ? 0.5 : 1);
  if (!(integral > 0) || !Number.isFinite(integral)) return null;
  const masses = logGrid(plotLo, plotHi, POINTS);
  return { name, masses, dndlogm: masses.map((m) => (shape(m) * total) / integral) };
}

/** Inputs for the model curves. */
export interface SpectrumContext {
  /** Thermal Jeans mass at the mean density of the surveyed gas, g. */
  referenceJeansMass: number;
  mach: number | null;
  velocitySpectrumIndex: number | null;
  coreToStarEfficiency: number;
}

/** Mass spectrum of candidate masses (g): sorted masses, Clauset et al. (2009) fit, model curves. */
export function massSpectrum(candidateMasses: readonly number[], ctx: SpectrumContext): MassSpectrum {
  const masses = [...candidateMasses].sort((a, b) => b - a);
  const fit = fitPowerLaw(masses);
  const n = masses.length;
  const eff = ctx.coreToStarEfficiency;
  const lo = n ? masses[n - 1]! : ctx.referenceJeansMass * 0.01;
  const hi = n ? masses[0]! : ctx.referenceJeansMass * 100;
  const [a, b] = lo === hi ? [lo / 2, hi * 2] : [lo, hi];
  const plotLo = a / 3, plotHi = b * 3;
  const total = Math.max(1, n);
  const models: ModelCurve[] = [];
  const add = (c: ModelCurve | null): void => { if (c) models.push(c); };
  if (ctx.mach !== null && ctx.velocitySpectrumIndex !== null && energySpectrumIndex(ctx.velocitySpectrumIndex) < 4) {
    const beta = energySpectrumIndex(ctx.velocitySpectrumIndex);
    add(normalisedCurve(`Padoan & Nordlund 2002 CMF (Mach ${ctx.mach.toFixed(2)}, beta ${beta.toFixed(2)})`,
      (m) => padoanNordlundCmf(m / ctx.referenceJeansMass, ctx.mach!, beta), plotLo, plotHi, a, b, total));
  }
  const core = (f: (mStar: number) => number) => (m: number) => f((eff * m) / M_SUN.value);
  const e = `efficiency ${eff}`;
  add(normalisedCurve(`Salpeter 1955 IMF as cores (${e})`, core(salpeterImf), plotLo, plotHi, a, b, total));
  add(normalisedCurve(`Kroupa 2001 IMF as cores (${e})`, core(kroupaImf), plotLo, plotHi, a, b, total));
  add(normalisedCurve(`Chabrier 2003 system IMF as cores (${e})`, core((m) => chabrierImf(m, 'system')), plotLo, plotHi, a, b, total));
  if (n) {
    const width = 0.25;
    const logs = masses.map((m) => Math.log10(eff * m));
    const start = Math.floor(Math.min(...logs) / width) * width;
    const bins = Math.floor((Math.max(...logs) - start) / width) + 1;
    const counts = new Array<number>(bins).fill(0);
    for (const l of logs) counts[Math.min(bins - 1, Math.floor((l - start) / width))]!++;
    models.push({
      name: `stellar masses implied by the candidates (${e})`,
      masses: counts.map((_, i) => 10 ** (start + (i + 0.5) * width)),
      dndlogm: counts.map((c) => c / width),
    });
  }
  return { masses, fit, models };
}
