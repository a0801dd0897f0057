/**
 * `fragplan budget --ladder`: generates the same cloud (same seed, phase-consistent modes) at
 * three resolutions, n/4, n/2 and n, surveys each and judges convergence (src/pipeline/ladder.ts).
 */
import type { LoadedConfig } from '../config/load.js';
import { createPool, defaultWorkerCount } from '../grid/pool.js';
import { silentProgress, type ProgressSink } from '../progress.js';
import { estimateGenerateBytes } from '../generate/generate-cloud.js';
import { estimateSurveyBytes } from '../survey/index.js';
import { assertFits } from './memory-guard.js';
import { generateAndSurvey, effectiveConfig } from './plan.js';
import { runLadder, rungConfig } from './ladder.js';

/** The three rungs for a finest resolution n: n/4, n/2, n (each at least 8). */
export function ladderRungs(n: number): number[] {
  return [...new Set([Math.max(8, n / 4), Math.max(8, n / 2), n])];
}

/** Runs the convergence ladder for a config; cells overrides the finest rung. */
export async function runLadderCommand(loaded: LoadedConfig, opts: { cells?: number; seed?: number; progress?: ProgressSink }): Promise<{ summary: Record<string, unknown>; text: string }> {
  const config = effectiveConfig(loaded.config, { cells: opts.cells, seed: opts.seed });
  const rungs = ladderRungs(config.grid.cells);
  const finest = rungs[rungs.length - 1]!;
  assertFits(`ladder rung at ${finest}^3`, estimateGenerateBytes(config, finest) + estimateSurveyBytes(finest));
  const workers = config.grid.workers ?? defaultWorkerCount();
  const pool = workers > 1 ? createPool(workers) : null;
  try {
    const r = await runLadder({ ...loaded, config }, rungs, async (cells) => {
      const t = performance.now();
      const { survey } = await generateAndSurvey(rungConfig(config, cells), pool, opts.progress ?? silentProgress, config.seed, cells);
      return { survey, seconds: (performance.now() - t) / 1000 };
    });
    return { summary: r.summary, text: r.text };
  } finally {
    await pool?.close();
  }
}
