/**
 * A pool of worker threads that run named tasks on SharedArrayBuffer-backed arrays.
 *
 * Work is split into line or cell ranges whose results do not depend on the split, so one
 * worker and two give the same bytes. The worker script is dist/worker.js (entry src/worker.ts,
 * which holds the task registry); from the TypeScript sources (tests) the built copy in dist/
 * is used, so run `npm run build` after changing a task.
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import type { WarmUp } from '../worker-warm-up.js';

/** A message to a worker: task name and its arguments (typed arrays on shared memory are shared). */
interface Job { id: number; task: string; args: unknown[] }
/** A queued task: the job, what to transfer with it, and its promise's ends. */
interface Queued { job: Job; transfer: readonly ArrayBuffer[]; resolve: (v: unknown) => void; reject: (e: Error) => void }
interface Reply { id: number; ok: boolean; value?: unknown; error?: string }

/** A running pool of worker threads. */
export interface WorkerPool {
  readonly size: number;
  /**
   * Runs one task on a free worker; resolves with its return value. `transfer`: buffers among the
   * arguments that move to the worker instead of being copied (unusable here afterwards).
   */
  run<T>(task: string, args: unknown[], transfer?: readonly ArrayBuffer[]): Promise<T>;
  /** Splits [0, total) into `size` contiguous ranges and runs task(start, end, ...args) on each. */
  runRanges<T>(task: string, total: number, args: unknown[]): Promise<T[]>;
  /** Stops every worker. */
  close(): Promise<void>;
}

/** Default number of workers: available cores, at most 8. */
export function defaultWorkerCount(): number {
  return Math.max(1, Math.min(8, availableParallelism()));
}

function workerScript(): string {
  const here = import.meta.url;
  if (here.endsWith('.ts')) return fileURLToPath(new URL('../../dist/worker.js', here));
  return fileURLToPath(new URL('./worker.js', here));
}

/** True unless `a` is a typed array off shared memory: a worker can use it in place (numbers, objects and null pass). */
export function onSharedMemory(a: unknown): boolean {
  return !ArrayBuffer.isView(a) || a.buffer instanceof SharedArrayBuffer;
}

/**
 * fn(...args) as the pool task `task` (registered for fn in src/worker.ts) when there is a pool and
 * every typed array among `arrays` (default: the arguments) is on shared memory; else fn here, at
 * once. The same function either way, so the same result.
 */
export function runWhole<A extends unknown[], T>(pool: WorkerPool | null, task: string, fn: (...args: A) => T, args: A, arrays: readonly unknown[] = args): Promise<T> {
  if (pool && arrays.every(onSharedMemory)) return pool.run<T>(task, args);
  try {
    return Promise.resolve(fn(...args));
  } catch (e) {
    return Promise.reject(e);
  }
}

/** Splits [0, total) into n near-equal contiguous ranges. */
export function splitRange(total: number, n: number): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let p = 0; p < n; p++) {
    const a = Math.floor((total * p) / n);
    const b = Math.floor((total * (p + 1)) / n);
    if (b > a) out.push([a, b]);
  }
  return out;
}

/** Tasks a worker holds at once (one running, the others waiting in its message queue). */
const PIPELINE = 2;

/** Starts a pool of `size` worker threads; `warmUp`: what each thread first runs on made-up data (src/worker-warm-up.ts). */
export function createPool(size: number = defaultWorkerCount(), warmUp?: WarmUp): WorkerPool {
  const script = workerScript();
  const workers: Worker[] = [];
  // tasks posted to each worker and not yet answered (running, or waiting in its message queue)
  const outstanding: number[] = [];
  const queue: Queued[] = [];
  const pending = new Map<number, { resolve: (v: unknown) => void; reject: (e: Error) => void; worker: number }>();
  let nextId = 0;

  // Each worker holds up to PIPELINE tasks: the next one already sits in its message queue when it
  // finishes, so it does not wait for this thread to receive the reply and post again (this thread
  // may be busy then: writing files, building the next tasks). Idle workers are served first.
  const dispatch = (): void => {
    while (queue.length) {
      let w = -1;
      for (let i = 0; i < workers.length; i++) if (outstanding[i]! < PIPELINE && (w < 0 || outstanding[i]! < outstanding[w]!)) w = i;
      if (w < 0) return;
      const item = queue.shift()!;
      pending.set(item.job.id, { resolve: item.resolve, reject: item.reject, worker: w });
      if (outstanding[w]!++ === 0) workers[w]!.ref(); // keep the process alive while a job runs; idle workers never hold it open
      workers[w]!.postMessage(item.job, item.transfer);
    }
  };

  for (let i = 0; i < size; i++) {
    const w = new Worker(script, { workerData: { warmUp } });
    w.on('message', (r: Reply) => {
      const p = pending.get(r.id);
      if (!p) return;
      pending.delete(r.id);
      if (--outstanding[i]! === 0) w.unref();
      if (r.ok) p.resolve(r.value);
      else p.reject(new Error(r.error ?? 'worker task failed'));
      dispatch();
    });
    w.on('error', (e) => {
      for (const [id, p] of pending) if (p.worker === i) { pending.delete(id); p.reject(e); }
    });
    w.unref();
    workers.push(w);
    outstanding.push(0);
  }

  const run = <T>(task: string, args: unknown[], transfer: readonly ArrayBuffer[] = []): Promise<T> =>
    new Promise<T>((resolve, reject) => {
      queue.push({ job: { id: nextId++, task, args }, transfer, resolve: resolve as (v: unknown) => void, reject });
      dispatch();
    });

  return {
    size,
    run,
    runRanges: <T>(task: string, total: number, args: unknown[]) =>
      Promise.all(splitRange(total, size).map(([a, b]) => run<T>(task, [a, b, ...args]))),
    close: async () => {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}
