import { describe, it, expect, beforeAll } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fragplan } from './helpers/cli.js';
import { encodeNpy } from '../src/export/npy.js';

const tmp = mkdtempSync(path.join(tmpdir(), 'fragplan-survey-'));

describe('fragplan survey', () => {
  beforeAll(() => {
    const r = fragplan(['plan', 'presets/massive-clump.yaml', '--cells', '32', '--out', path.join(tmp, 'run'), '--quiet']);
    expect(r.status).toBe(0);
  });

  it('a run folder gives the same hierarchy as the plan that made it', () => {
    const plan = JSON.parse(readFileSync(path.join(tmp, 'run', 'summary.json'), 'utf8'));
    const r = fragplan(['survey', path.join(tmp, 'run'), '--out', path.join(tmp, 'sv'), '--json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout);
    for (const k of ['nodes', 'unstable_nodes', 'fragment_candidates', 'expected_fragments']) expect(s.hierarchy[k], k).toBe(plan.hierarchy[k]);
  });

  it('a .npy cube needs --box-size', () => {
    const r = fragplan(['survey', path.join(tmp, 'run', 'ic', 'density.npy'), '--out', path.join(tmp, 'sv2')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--box-size: required/);
  });

  it('a .npy cube with NaN is refused naming the file', () => {
    const a = new Float32Array(8 ** 3).fill(1e-20);
    a[17] = NaN;
    const f = path.join(tmp, 'nan.npy');
    writeFileSync(f, encodeNpy(a, [8, 8, 8]));
    const r = fragplan(['survey', f, '--box-size', '1 pc', '--out', path.join(tmp, 'sv3')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/nan\.npy: .*(NaN|non-finite|finite)/i);
  });

  it('a cube of the wrong dimension of unit is refused', () => {
    const r = fragplan(['survey', path.join(tmp, 'run', 'ic', 'density.npy'), '--box-size', '2 Msun']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--box-size: expected length/);
  });

  it('a number-density cube in cm^-3 is read as n(H2)', () => {
    const n = 16;
    const a = new Float32Array(n ** 3).fill(1e4);
    const f = path.join(tmp, 'nh2.npy');
    writeFileSync(f, encodeNpy(a, [n, n, n]));
    const r = fragplan(['survey', f, '--box-size', '1 pc', '--density-unit', 'cm^-3', '--out', path.join(tmp, 'sv4'), '--json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout);
    // rho = mu_H2 m_H n(H2) with mu_H2 = 2.8 (common practice, Kauffmann et al. 2008); M = rho L^3
    const rho = 2.8 * 1.6735575e-24 * 1e4;
    const massMsun = (rho * 3.0856775814913673e18 ** 3) / (1.3271244e26 / 6.6743e-8);
    expect(s.grid.mass_on_grid_msun / massMsun).toBeCloseTo(1, 5);
  });
});

describe('fragplan survey with velocity cubes', () => {
  it('reads signed velocities and uses them for turbulent support', () => {
    const run = path.join(tmp, 'run', 'ic');
    const v = ['x', 'y', 'z'].map((a) => path.join(run, `velocity_${a}.npy`)).join(',');
    const withV = fragplan(['survey', path.join(run, 'density.npy'), '--box-size', '2 pc', '--temperature', '15 K', '--velocity', v, '--out', path.join(tmp, 'sv5'), '--json']);
    expect(withV.stderr).toBe('');
    expect(withV.status).toBe(0);
    const without = fragplan(['survey', path.join(run, 'density.npy'), '--box-size', '2 pc', '--temperature', '15 K', '--out', path.join(tmp, 'sv6'), '--json']);
    const a = JSON.parse(withV.stdout).hierarchy, b = JSON.parse(without.stdout).hierarchy;
    expect(a.nodes).toBe(b.nodes);
    // turbulent support raises every Jeans mass, so never more unstable nodes than with thermal support alone
    expect(a.unstable_nodes).toBeLessThanOrEqual(b.unstable_nodes);
  });
});
