/**
 * The worker threads of a plan: the pool for the grid work and, beside it, the merge tree's own
 * worker (the lane). The CLI starts them before it loads the pipeline and the config, so that the
 * threads boot meanwhile; runPlan keeps them when they match the config's worker count.
 */
import { createPool, type WorkerPool } from '../grid/pool.js';

/** A plan's threads: `workers` counts the pool's workers (1: no pool, no lane, everything inline). */
export interface PlanPools {
  readonly workers: number;
  readonly pool: WorkerPool | null;
  readonly lane: WorkerPool | null;
}

/** Starts the pool (and the lane) for `workers` threads; none for one thread. */
export function startPlanPools(workers: number): PlanPools {
  if (workers <= 1) return { workers: 1, pool: null, lane: null };
  return { workers, pool: createPool(workers, 'transforms'), lane: createPool(1) };
}

/** Stops every thread of the pools. */
export async function closePlanPools(p: PlanPools): Promise<void> {
  await Promise.all([p.pool?.close(), p.lane?.close()]);
}

/** Pools for `workers` threads: `early` when it was started with that count, else new ones (early is closed). */
export async function planPools(workers: number, early?: PlanPools): Promise<PlanPools> {
  const want = Math.max(1, workers);
  if (early && early.workers === want) return early;
  if (early) await closePlanPools(early);
  return startPlanPools(want);
}
