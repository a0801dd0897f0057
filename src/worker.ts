/**
 * Worker-thread entry: the registry of tasks a WorkerPool can run (see src/grid/pool.ts).
 * Each task takes (start, end, ...args) or plain args and writes into shared typed arrays.
 * Add a task by importing its function and listing it in TASKS.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { warmUp, type WarmUp } from './worker-warm-up.js';
import { forwardZ, complexAxis, inverseZ } from './grid/fft3.js';
import type { Grid3 } from './grid/grid3.js';
import { GENERATE_TASKS } from './generate/worker-tasks.js';
import { SURVEY_TASKS } from './survey/worker-tasks.js';
import { REPORT_TASKS } from './report/worker-tasks.js';
import { EXPORT_TASKS } from './export/worker-tasks.js';

type Task = (...args: never[]) => unknown;

const TASKS: Record<string, Task> = {
  fftForwardZ: (start: number, end: number, field: Float32Array, spec: Float64Array, g: Grid3) => forwardZ(field, spec, g, start, end),
  fftAxis: (start: number, end: number, spec: Float64Array, g: Grid3, axis: 0 | 1, inverse: boolean) => complexAxis(spec, g, axis, inverse, start, end),
  fftInverseZ: (start: number, end: number, spec: Float64Array, field: Float32Array, g: Grid3, band: number) => inverseZ(spec, field, g, start, end, band),
  fftAxisBand: (start: number, end: number, spec: Float64Array, g: Grid3, axis: 0 | 1, inverse: boolean, band: number) => complexAxis(spec, g, axis, inverse, start, end, band),
  ...GENERATE_TASKS,
  ...SURVEY_TASKS,
  ...REPORT_TASKS,
  ...EXPORT_TASKS,
};

// a plan's threads first warm up the functions they will run (src/worker-warm-up.ts); messages wait meanwhile
warmUp((workerData as { warmUp?: WarmUp } | null)?.warmUp);

parentPort?.on('message', (job: { id: number; task: string; args: unknown[] }) => {
  const fn = TASKS[job.task];
  try {
    if (!fn) throw new Error(`unknown worker task "${job.task}"`);
    const value = (fn as (...a: unknown[]) => unknown)(...job.args);
    parentPort!.postMessage({ id: job.id, ok: true, value });
  } catch (e) {
    parentPort!.postMessage({ id: job.id, ok: false, error: e instanceof Error ? e.message : String(e) });
  }
});
