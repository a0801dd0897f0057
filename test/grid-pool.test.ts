/** The worker pool: many tasks on few workers (each holds up to two at once), buffers moved instead of copied. */
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { createPool, type WorkerPool } from '../src/grid/pool.js';
import { gravityBatch } from '../src/survey/node-gravity.js';
import type { CoarseMass } from '../src/survey/self-gravity.js';

/** A made-up coarse mass grid of g^3 cells (g a power of two), masses from a fixed sequence. */
function grid(g: number, seed: number): CoarseMass {
  const mass = new Float64Array(g ** 3);
  let x = seed;
  for (let q = 0; q < mass.length; q++) { x = (x * 16807) % 2147483647; mass[q] = x % 5 === 0 ? 0 : 1e30 * (x / 2147483647); }
  let occupied = 0;
  for (const m of mass) if (m > 0) occupied++;
  return { g, factor: 1, side: 3e16, mass, occupied };
}

describe('worker pool', () => {
  let pool: WorkerPool;
  beforeAll(() => { pool = createPool(2); });
  afterAll(async () => { await pool.close(); });

  it('runs more tasks than workers, each answered with its own result, the same as here', async () => {
    const grids = Array.from({ length: 9 }, (_, i) => grid(i % 3 === 0 ? 16 : 8, 11 + i));
    const want = grids.map((c) => gravityBatch([{ adaptive: c }], 0.01));
    const got = await Promise.all(grids.map((c) => pool.run('surveyGravityBatch', [[{ adaptive: c }], 0.01])));
    expect(got).toEqual(want);
  });

  it('moves transferred buffers to the worker: detached here, the result unchanged', async () => {
    const c = grid(16, 5);
    const want = gravityBatch([{ adaptive: { ...c, mass: Float64Array.from(c.mass) } }], 0.01);
    const got = await pool.run('surveyGravityBatch', [[{ adaptive: c }], 0.01], [c.mass.buffer as ArrayBuffer]);
    expect(c.mass.byteLength).toBe(0);
    expect(got).toEqual(want);
  });
});
