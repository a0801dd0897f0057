/**
 * Outside check: h5py (Debian's python3-h5py, on the HDF5 C library) reads our HDF5 export: root
 * attributes, /grid datasets with shape, dtype, unit attributes and our values, /particles arrays,
 * and hashlib's sha256 of the file matches the manifest. Sources: HDF5 file format (The HDF Group,
 * open standard); h5py as the reference reader (common practice).
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { mkdtempSync, rmSync, readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pythonJson } from '../helpers/python.js';
import { fixtureCloud } from '../helpers/export-cloud.js';
import { writeGridExports } from '../../src/export/grid-exports.js';
import { PC, M_SUN } from '../../src/physics/constants.js';

const META = { toolVersion: '0.1.0', seed: 11, configText: 'seed: 11\n', configSha256: 'c'.repeat(64), name: 'h5-test' };

const READ = `
import sys, json, hashlib, h5py, numpy as np
a = json.load(sys.stdin)
p = a['file']
f = h5py.File(p, 'r')
out = {'root': {k: (v.tolist() if hasattr(v, 'tolist') else (v.decode() if isinstance(v, bytes) else v)) for k, v in f.attrs.items()},
       'grid': {}, 'particles': {}, 'sha256': hashlib.sha256(open(p, 'rb').read()).hexdigest()}
for k, d in f['grid'].items():
    out['grid'][k] = {'shape': list(d.shape), 'dtype': str(d.dtype), 'attrs': {n: (v.tolist() if hasattr(v, 'tolist') else v) for n, v in d.attrs.items()},
                      'values': d[...].astype(np.float64).ravel().tolist(), 'chunks': list(d.chunks) if d.chunks else None}
if 'particles' in f:
    for k, d in f['particles'].items():
        out['particles'][k] = {'shape': list(d.shape), 'dtype': str(d.dtype), 'unit': d.attrs['unit'], 'to_cgs': float(d.attrs['to_cgs']),
                               'sum': d[...].astype(np.float64).sum(axis=0).tolist()}
print(json.dumps(out))
`;

interface H5Read {
  root: Record<string, unknown>;
  grid: Record<string, { shape: number[]; dtype: string; attrs: Record<string, unknown>; values: number[]; chunks: number[] | null }>;
  particles: Record<string, { shape: number[]; dtype: string; unit: string; to_cgs: number; sum: number | number[] }>;
  sha256: string;
}

describe('h5py reads the HDF5 export', () => {
  let dir: string;
  beforeAll(() => { dir = mkdtempSync(path.join(tmpdir(), 'fragplan-h5-')); return () => rmSync(dir, { recursive: true, force: true }); });

  it('cgs float32: datasets, unit attributes, values and checksum', async () => {
    const cloud = fixtureCloud({ n: 8 });
    const icDir = path.join(dir, 'cgs');
    const m = await writeGridExports(cloud, icDir, { formats: ['hdf5'], precision: 'float32', units: 'cgs', thermalField: 'temperature', force: false }, META);
    const r = pythonJson<H5Read>(READ, JSON.stringify({ file: path.join(icDir, 'cloud.h5') }));
    expect(r.sha256).toBe(m.files['cloud.h5']!.sha256);
    expect(r.root.unit_system).toBe('cgs');
    expect(r.root.seed).toBe(11);
    expect(r.root.shape).toEqual([8, 8, 8]);
    expect(Object.keys(r.grid).sort()).toEqual(['density', 'magnetic_x', 'magnetic_y', 'magnetic_z', 'temperature', 'velocity_x', 'velocity_y', 'velocity_z']);
    const d = r.grid.density!;
    expect(d.shape).toEqual([8, 8, 8]);
    expect(d.dtype).toBe('float32');
    expect(d.attrs.unit).toBe('g cm^-3');
    expect(d.attrs.to_cgs).toBe(1);
    expect(d.chunks).toEqual([1, 8, 8]);
    for (let q = 0; q < cloud.density.length; q++) expect(d.values[q]).toBe(cloud.density[q]);
    const vz = r.grid.velocity_z!;
    expect(vz.attrs.unit).toBe('cm s^-1');
    for (let q = 0; q < cloud.density.length; q++) expect(vz.values[q]).toBe(cloud.velocity[2][q]);
    expect(r.grid.magnetic_z!.attrs.unit).toBe('G (gauss)');
  });

  it('code units float64 with particles: G = 1 attribute, unit factors, particle arrays', async () => {
    const cloud = fixtureCloud({ n: 8 });
    const icDir = path.join(dir, 'code');
    const code = { length: PC.value, mass: M_SUN.value };
    const m = await writeGridExports(cloud, icDir, {
      formats: ['hdf5'], precision: 'float64', units: 'code', codeUnits: code, thermalField: 'internal_energy',
      particles: { count: 3000, method: 'monte-carlo' }, force: false,
    }, META);
    const r = pythonJson<H5Read>(READ, JSON.stringify({ file: path.join(icDir, 'cloud.h5') }));
    const units = JSON.parse(String(r.root.units_json)) as { gravitational_constant: number };
    expect(Math.abs(units.gravitational_constant - 1)).toBeLessThan(1e-12);
    const d = r.grid.density!;
    expect(d.dtype).toBe('float64');
    const toCgs = d.attrs.to_cgs as number;
    // density unit M/L^3 (common practice for code units)
    expect(Math.abs(toCgs / (M_SUN.value / PC.value ** 3) - 1)).toBeLessThan(1e-14);
    for (let q = 0; q < cloud.density.length; q++) expect(Math.abs(d.values[q]! * toCgs / cloud.density[q]! - 1)).toBeLessThan(1e-12);
    expect(r.grid.internal_energy).toBeDefined();
    const pos = r.particles.position!;
    expect(pos.shape).toEqual([3000, 3]);
    expect(pos.dtype).toBe('float64');
    const mass = r.particles.mass!;
    expect(mass.shape).toEqual([3000]);
    // particle masses sum to the grid mass (in code units times the mass unit)
    expect(Math.abs((mass.sum as number) * mass.to_cgs / cloud.summary.massOnGrid - 1)).toBeLessThan(1e-9);
    expect(Object.keys(r.particles).sort()).toEqual(['internal_energy', 'mass', 'position', 'smoothing_length', 'velocity']);
    expect(m.particles!.count).toBe(3000);
  });

  it('the same cloud and seed give byte-identical HDF5 files (object time stamps pinned)', async () => {
    const cloud = fixtureCloud({ n: 4 });
    const opts = { formats: ['hdf5' as const], precision: 'float32' as const, units: 'cgs' as const, thermalField: 'temperature' as const, force: false };
    await writeGridExports(cloud, path.join(dir, 'r1'), opts, META);
    await new Promise((res) => setTimeout(res, 1100));
    await writeGridExports(cloud, path.join(dir, 'r2'), opts, META);
    const h = (p: string): string => createHash('sha256').update(readFileSync(p)).digest('hex');
    expect(h(path.join(dir, 'r1', 'cloud.h5'))).toBe(h(path.join(dir, 'r2', 'cloud.h5')));
  });
});
