/** Refuses a run whose estimated peak memory will not fit, before anything large is allocated. */
import { totalmem } from 'node:os';
import { MemoryRefusal } from '../input-error.js';

/** Bytes the tool lets one run use: FRAGPLAN_MEMORY_LIMIT_GB if set, else 85 % of physical memory. */
export function memoryLimitBytes(): number {
  const env = Number(process.env.FRAGPLAN_MEMORY_LIMIT_GB);
  if (Number.isFinite(env) && env > 0) return env * 2 ** 30;
  return 0.85 * totalmem();
}

/** Formats bytes as GiB with one decimal. */
export function gib(bytes: number): string {
  return `${(bytes / 2 ** 30).toFixed(1)} GiB`;
}

/** Throws MemoryRefusal (exit 2) when the estimate exceeds the limit. */
export function assertFits(what: string, estimateBytes: number, limit = memoryLimitBytes()): void {
  if (estimateBytes > limit) {
    throw new MemoryRefusal(`${what}: needs about ${gib(estimateBytes)} of memory, more than the ${gib(limit)} available (lower --cells, or set FRAGPLAN_MEMORY_LIMIT_GB)`, estimateBytes);
  }
}
