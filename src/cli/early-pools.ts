/**
 * The plan's worker threads, started from the raw arguments before the command line loads: for
 * `plan` with no --workers or a positive integer one. Anything else (another command, a bad
 * value) starts nothing and is left to the command parser.
 */
import { defaultWorkerCount } from '../grid/pool.js';
import { startPlanPools, type PlanPools } from '../pipeline/plan-pools.js';

/** Worker count `plan` will ask for, read from raw arguments (after the program name), or null when they are not a plan or the count is not a positive integer. */
export function earlyWorkerCount(args: readonly string[]): number | null {
  if (args[0] !== 'plan') return null;
  let value: string | undefined;
  for (let i = 1; i < args.length; i++) {
    const a = args[i]!;
    if (a === '--') break;
    if (a === '--workers') value = args[i + 1];
    else if (a.startsWith('--workers=')) value = a.slice('--workers='.length);
  }
  if (value === undefined) return defaultWorkerCount();
  const n = Number(value);
  return Number.isInteger(n) && n >= 1 ? n : null;
}

/** Starts the plan's threads for the raw arguments (see earlyWorkerCount), or returns null. */
export function earlyPlanPools(args: readonly string[]): PlanPools | null {
  const n = earlyWorkerCount(args);
  return n === null ? null : startPlanPools(n);
}
