import { describe, it, expect } from 'vitest';
import { surveyCloud } from '../src/survey/survey-cloud.js';
import type { SurveyOptions } from '../src/survey/types.js';

const G = 6.6743e-8; // CODATA 2018
const K_B = 1.380649e-16;
const M_H = 1.6735575e-24;
const T = 10, MU = 2.33;
const CS = Math.sqrt((K_B * T) / (MU * M_H));
/** Jeans mass, sphere of diameter lambda_J: (pi^(5/2)/6) c_s^3 G^(-3/2) rho^(-1/2) (Jeans 1902; as in DESIGN.md). */
const jeansMassSphere = (rho: number) => (Math.PI ** 2.5 / 6) * CS ** 3 * G ** -1.5 * rho ** -0.5;

const base: SurveyOptions = {
  jeansConvention: 'sphere', turbulentSupport: true, requireBound: false, connectivity: 6, minCells: 8, minContrast: 0.5,
  minMass: 0, floorDensity: Number.NaN, gravityCells: 32, coreToStarEfficiency: 0.3, mach: null, velocitySpectrumIndex: null,
};

/** Box of n^3 cells of side dx with ambient density and uniform spheres (centre in cells, radius in cells, density). */
function spheres(n: number, ambient: number, list: Array<[number, number, number, number, number]>): Float32Array {
  const d = new Float32Array(n ** 3).fill(ambient);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) {
    for (const [cx, cy, cz, r, rho] of list) {
      const x = i + 0.5 - cx, y = j + 0.5 - cy, z = k + 0.5 - cz;
      if (x * x + y * y + z * z < r * r) d[(i * n + j) * n + k] = Math.max(d[(i * n + j) * n + k]!, rho);
    }
  }
  return d;
}

describe('surveyCloud', () => {
  const n = 32;
  it('finds no node in an empty or uniform cube', async () => {
    const d = new Float32Array(n ** 3).fill(1e-20);
    const r = await surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: 1e18 }, density: d, temperature: T, mu: MU }, base);
    expect(r.nodes.length).toBe(0);
    expect(r.candidates).toEqual([]);
    expect(r.labels.every((l) => l === -1)).toBe(true);
    expect(r.floorRule).toMatch(/mean density/);
  });

  it('surveys a single cell', async () => {
    const r = await surveyCloud({ grid: { nx: 1, ny: 1, nz: 1, boxSize: 1e17 }, density: new Float32Array([1e-18]), temperature: T, mu: MU }, { ...base, floorDensity: 0, minCells: 1 });
    expect(r.nodes.length).toBe(1);
    expect(r.nodes[0]!.gravitationalEnergy).toBeLessThan(0);
  });

  it('finds two candidates in two well-separated Jeans-unstable spheres', async () => {
    const rho = 1e-17, dx = 1e16;
    const rCells = 5;
    const mass = (4 / 3) * Math.PI * (rCells * dx) ** 3 * rho;
    expect(mass).toBeGreaterThan(2 * jeansMassSphere(rho)); // the set-up itself: unstable by the formula
    const d = spheres(n, rho / 100, [[8, 8, 8, rCells, rho], [24, 24, 24, rCells, rho]]);
    const r = await surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: T, mu: MU }, { ...base, floorDensity: rho / 50 });
    expect(r.nodes.length).toBe(2);
    expect(r.candidates.length).toBe(2);
    for (const id of r.candidates) {
      const node = r.nodes[id]!;
      expect(node.jeansMass / jeansMassSphere(node.meanDensity) - 1).toBeCloseTo(0, 10); // no motions: turbulent = thermal
      expect(node.bound).toBe(true);
      expect(node.state).toBe('bound-unstable');
      expect(node.expectedFragments).toBe(Math.max(1, Math.floor(node.mass / node.jeansMass)));
    }
    expect(r.expectedFragments).toBe(r.nodes[0]!.expectedFragments + r.nodes[1]!.expectedFragments);
  });

  it('finds none in a sphere below its Jeans mass', async () => {
    const rho = 1e-19, dx = 1e15;
    const d = spheres(n, rho / 100, [[16, 16, 16, 6, rho]]);
    const mass = (4 / 3) * Math.PI * (6 * dx) ** 3 * rho;
    expect(mass).toBeLessThan(jeansMassSphere(rho));
    const r = await surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: T, mu: MU }, { ...base, floorDensity: rho / 50 });
    expect(r.nodes.length).toBe(1);
    expect(r.candidates).toEqual([]);
    expect(r.nodes[0]!.state).toBe('stable');
  });

  it('nests dense cores inside their parent sphere, and the cores are the candidates', async () => {
    const rho = 1e-17 / 30, dx = 1.2e16;
    const d = spheres(n, rho / 100, [[16, 16, 16, 12, rho], [11, 16, 16, 3.5, 30 * rho], [21, 16, 16, 3.5, 30 * rho]]);
    expect((4 / 3) * Math.PI * (3.5 * dx) ** 3 * 30 * rho).toBeGreaterThan(jeansMassSphere(30 * rho)); // cores unstable by the formula
    const r = await surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: T, mu: MU }, { ...base, floorDensity: rho / 50 });
    expect(r.roots.length).toBe(1);
    const root = r.nodes[r.roots[0]!]!;
    expect(root.children.length).toBe(2);
    for (const c of root.children) {
      expect(r.nodes[c]!.parent).toBe(root.id);
      expect(r.nodes[c]!.peakDensity).toBeCloseTo(Math.fround(30 * rho), 25);
      expect(r.nodes[c]!.mergeDensity).toBeCloseTo(Math.fround(rho), 25);
    }
    // the parent's mass contains its children
    expect(root.mass).toBeGreaterThan(r.nodes[root.children[0]!]!.mass + r.nodes[root.children[1]!]!.mass);
    expect([...r.candidates].sort()).toEqual([...root.children].sort());
    // per-cell labels: the two core centres carry the two core ids; ambient cells are outside every node
    const at = (i: number, j: number, k: number) => r.labels[(i * n + j) * n + k]!;
    expect(new Set([at(10, 15, 15), at(20, 15, 15)])).toEqual(new Set(root.children));
    expect(at(0, 0, 0)).toBe(-1);
    expect(r.labels.every((l) => l === -1 || l === root.id || root.children.includes(l))).toBe(true);
  });

  it('absorbs a bump below the contrast limit', async () => {
    const rho = 3e-19, dx = 4e15;
    const d = spheres(n, rho / 100, [[16, 16, 16, 12, rho], [11, 16, 16, 3.5, 1.2 * rho], [21, 16, 16, 3.5, 1.2 * rho]]);
    const r = await surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: T, mu: MU }, { ...base, floorDensity: rho / 50, minContrast: 0.5 });
    expect(r.nodes.length).toBe(1);
  });

  it('takes kinetic energy relative to the centre-of-mass motion', async () => {
    const rho = 1e-18, dx = 3e15;
    const d = spheres(n, rho / 100, [[16, 16, 16, 6, rho]]);
    const v = () => new Float32Array(n ** 3).fill(1e5);
    const still = await surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: T, mu: MU }, { ...base, floorDensity: rho / 50 });
    const moving = await surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, velocity: [v(), v(), v()], temperature: T, mu: MU }, { ...base, floorDensity: rho / 50 });
    expect(moving.nodes[0]!.kineticEnergy).toBeLessThan(1e-6 * moving.nodes[0]!.thermalEnergy);
    expect(moving.nodes[0]!.gravitationalEnergy).toBe(still.nodes[0]!.gravitationalEnergy);
  });
});

describe('surveyCloud over a worker pool', () => {
  it('gives the same energies with two workers as without (needs the built dist/worker.js)', async () => {
    const { createPool } = await import('../src/grid/pool.js');
    const n = 32, dx = 1e16, rho = 1e-17;
    let s = 11;
    const d = Float32Array.from({ length: n ** 3 }, () => { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; return rho * (0.2 + (s / 2 ** 32) ** 4 * 5); });
    const input = { grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: T, mu: MU };
    const opts = { ...base, floorDensity: rho, minCells: 2, minContrast: 0.1 };
    const single = await surveyCloud(input, opts);
    const pool = createPool(2);
    try {
      const multi = await surveyCloud(input, opts, undefined, pool);
      expect(multi.nodes.length).toBe(single.nodes.length);
      expect(single.nodes.length).toBeGreaterThan(3);
      expect(multi.nodes.map((x) => x.gravitationalEnergy)).toEqual(single.nodes.map((x) => x.gravitationalEnergy));
    } finally {
      await pool.close();
    }
  });
});

describe('merge tree on its own worker', () => {
  it('gives the same tree, labels and survey as the inline build (needs the built dist/worker.js)', async () => {
    const { createPool } = await import('../src/grid/pool.js');
    const { startMergeTree } = await import('../src/survey/tree-task.js');
    const n = 32, dx = 1e16, rho = 1e-17;
    let s = 5;
    // the density on shared memory, as the generator leaves it when it runs on a pool
    const d = new Float32Array(new SharedArrayBuffer(4 * n ** 3));
    for (let c = 0; c < d.length; c++) { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; d[c] = rho * (0.2 + (s / 2 ** 32) ** 4 * 5); }
    const input = { grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: T, mu: MU };
    const opts = { ...base, floorDensity: rho, minCells: 2, minContrast: 0.1 };
    const inline = await surveyCloud(input, opts);
    const lane = createPool(1);
    try {
      const pending = startMergeTree(d, input.grid, opts, lane);
      expect(pending.running).not.toBeNull();
      const viaWorker = await surveyCloud(input, opts, undefined, null, pending);
      expect(inline.nodes.length).toBeGreaterThan(3);
      expect(viaWorker.labels.buffer).toBeInstanceOf(SharedArrayBuffer);
      expect(Buffer.compare(Buffer.from(viaWorker.labels.buffer as SharedArrayBuffer), Buffer.from(inline.labels.buffer))).toBe(0);
      expect(JSON.stringify(viaWorker.nodes)).toBe(JSON.stringify(inline.nodes));
      // a tree started on another cube, or with another floor, is refused
      await expect(surveyCloud({ ...input, density: d.slice() }, opts, undefined, null, pending)).rejects.toThrow(/another density cube/);
      await expect(surveyCloud(input, { ...opts, floorDensity: 2 * rho }, undefined, null, pending)).rejects.toThrow(/floor/);
    } finally {
      await lane.close();
    }
  });
});
