/**
 * bench/reference_plan.py (the numpy/scipy script the benchmark compares against) does the work
 * it claims: checked with numpy on its own .npy output at 64^3 (C order, shape (N, N, N), index
 * (i*N + j)*N + k, i along x, cell-centred, cgs).
 */
import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { PYTHON, pythonJson } from './helpers/python.js';

const SCRIPT = path.resolve('bench/reference_plan.py');
const N = 64;
let dir = '';

// Everything numpy measures on the script's output, independent of the script's own code.
const MEASURE = String.raw`
import json, sys, numpy as np
d, n, zeta_expected = sys.argv[1], int(sys.argv[2]), float(sys.argv[3])
p = json.load(open(d + '/params.json'))
rho = np.load(d + '/density.npy'); v = [np.load(d + '/velocity_%s.npy' % c).astype(np.float64) for c in 'xyz']
G, KB, MH = 6.6743e-8, 1.380649e-16, 1.6735575e-24          # CODATA 2018; hydrogen-atom mass (common practice)
MSUN = 1.3271244e26 / G; PC = 648000 / np.pi * 1.495978707e13 # IAU 2015
R = p['radius_pc'] * PC; L = 2 * R * 1.25; dx = L / n
x = -L / 2 + (np.arange(n) + 0.5) * dx
inside = (x[:, None, None]**2 + x[None, :, None]**2 + x[None, None, :]**2) < R * R
r64 = rho.astype(np.float64)
cs = np.sqrt(KB * p['temperature_k'] / (p['mu'] * MH))
mach = np.sqrt(sum((r64 * c * c)[inside].sum() for c in v) / r64[inside].sum()) / cs
momentum = [float((r64 * c)[inside].sum()) for c in v]
scale = float(r64[inside].sum() * np.sqrt(sum((c * c)[inside].mean() for c in v)))
k = np.fft.fftfreq(n, 1.0 / n)
kx, ky, kz = np.meshgrid(k, k, k, indexing='ij')
vh = [np.fft.fftn(c) for c in v]
kdotv = kx * vh[0] + ky * vh[1] + kz * vh[2]
k2 = kx**2 + ky**2 + kz**2; k2[0, 0, 0] = 1
power = sum(abs(c)**2 for c in vh).sum()
long_power = (abs(kdotv)**2 / k2).sum()
kk = np.sqrt(kx**2 + ky**2 + kz**2)
shell = np.rint(kk).astype(int)
pw = sum(abs(c)**2 for c in vh)
ks = np.arange(3, n // 2 - 2)
mean_p = np.array([pw[shell == s].mean() for s in ks])
slope = np.polyfit(np.log(ks), np.log(mean_p), 1)[0]
jmax = dx * np.sqrt(G * rho.max() / (np.pi * cs * cs))
print(json.dumps({'mach': mach, 'momentum_rel': max(abs(m) for m in momentum) / scale,
  'cloud_mass_msun': float(r64[inside].sum() * dx**3 / MSUN), 'compressive_fraction': float(long_power / power),
  'slope': float(slope), 'jmax': float(jmax), 'mach_expected': p['mach'], 'mass_expected': p['mass_msun']}))
`;

function runScript(out: string, extra: string[]): void {
  execFileSync(PYTHON, [SCRIPT, '--cells', String(N), '--out', out, '--seed', '7', '--levels', '12', ...extra]);
}

function params(out: string, p: Record<string, number>): void {
  execFileSync(PYTHON, ['-c', `import json,sys; json.dump(json.loads(sys.argv[2]), open(sys.argv[1] + '/params.json', 'w'))`, out, JSON.stringify(p)]);
}

interface Measured { mach: number; momentum_rel: number; cloud_mass_msun: number; compressive_fraction: number; slope: number; jmax: number; mach_expected: number; mass_expected: number }

function measure(out: string, zeta: number): Measured {
  return JSON.parse(execFileSync(PYTHON, ['-c', MEASURE, out, String(N), String(zeta)]).toString()) as Measured;
}

describe('bench/reference_plan.py', () => {
  const p = { mass_msun: 500, radius_pc: 0.5, temperature_k: 10, mu: 2.33, mach: 6 };
  const common = ['--mass-msun', '500', '--radius-pc', '0.5', '--temperature-k', '10', '--mu', '2.33', '--mach', '6'];
  beforeAll(() => {
    dir = mkdtempSync(path.join(tmpdir(), 'bench-ref-'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  // --ambient-turbulence keeps the field in the whole box, so its spectrum can be measured there
  // (by default the ambient gas is at rest, as in fragplan, and the cut at the cloud edge adds power)
  it('a solenoidal field has no compressive power, the requested Mach number, zero momentum and the cloud mass', () => {
    const out = path.join(dir, 'sol');
    runScript(out, [...common, '--solenoidal-weight', '1', '--ambient-turbulence']);
    params(out, p);
    const m = measure(out, 1);
    // Helmholtz projection with zeta = 1 leaves no longitudinal part (Federrath et al. 2010)
    expect(m.compressive_fraction).toBeLessThan(1e-6);
    expect(Math.abs(m.mach / m.mach_expected - 1)).toBeLessThan(1e-3);
    expect(m.momentum_rel).toBeLessThan(1e-5);
    expect(Math.abs(m.cloud_mass_msun / m.mass_expected - 1)).toBeLessThan(1e-5);
    // P(k) ~ k^-4 per mode over the driven range (Burgers-like; common practice), slope within 0.1
    expect(Math.abs(m.slope + 4)).toBeLessThan(0.1);
  });

  it('a natural mix (zeta = 0.5) has the compressive fraction Federrath et al. 2010 give', () => {
    const out = path.join(dir, 'mix');
    // a flat spectrum spreads the power over ~10^5 modes, so one realisation sits close to the mean
    runScript(out, [...common, '--solenoidal-weight', '0.5', '--velocity-index', '0', '--ambient-turbulence']);
    params(out, p);
    const m = measure(out, 0.5);
    // chi = (1 - zeta)^2 / (1 - 2 zeta + 3 zeta^2) = 1/3 at zeta = 0.5 (Federrath et al. 2010);
    expect(Math.abs(m.compressive_fraction - 1 / 3)).toBeLessThan(0.01);
  });

  it('keeps the ambient gas at rest by default, with the Mach number and momentum still right', () => {
    const out = path.join(dir, 'rest');
    runScript(out, [...common]);
    params(out, p);
    const m = measure(out, 1);
    const outsideSpeed = pythonJson<number>(String.raw`
import json, numpy as np
L = 2 * 0.5 * 1.25; x = -L / 2 + (np.arange(${N}) + 0.5) * L / ${N}
outside = (x[:, None, None]**2 + x[None, :, None]**2 + x[None, None, :]**2) >= 0.25
print(json.dumps(float(max(abs(np.load(${JSON.stringify(out)} + '/velocity_%s.npy' % c)[outside]).max() for c in 'xyz'))))`);
    expect(outsideSpeed).toBe(0);
    expect(Math.abs(m.mach / m.mach_expected - 1)).toBeLessThan(1e-3);
    expect(m.momentum_rel).toBeLessThan(1e-5);
  });

  it('reports the largest Jeans number dx/lambda_J of its own density cube (Truelove et al. 1997)', () => {
    const out = path.join(dir, 'sol');
    const s = pythonJson<{ jeans_number_max: number; fragment_candidates: number; regions: number }>(`import json; print(json.dumps(json.load(open(${JSON.stringify(out + '/summary.json')}))))`);
    const m = measure(out, 1);
    expect(Math.abs(s.jeans_number_max / m.jmax - 1)).toBeLessThan(1e-5);
    expect(s.regions).toBeGreaterThan(0);
  });

  it('no fragment candidate has an unstable descendant in regions.csv', () => {
    const out = path.join(dir, 'sol');
    const r = pythonJson<{ bad: number; candidates: number }>(String.raw`
import csv, json
rows = list(csv.DictReader(open(${JSON.stringify(out + '/regions.csv')})))
parent = {int(r['row']): int(r['parent']) for r in rows}
unstable = {int(r['row']) for r in rows if r['unstable'] == '1'}
cands = [int(r['row']) for r in rows if r['candidate'] == '1']
bad = 0
for u in unstable:
    a = parent[u]
    while a >= 0:
        if a in cands: bad += 1
        a = parent[a]
print(json.dumps({'bad': bad, 'candidates': len(cands)}))
`);
    expect(r.bad).toBe(0);
  });
});
