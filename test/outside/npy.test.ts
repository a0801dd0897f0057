/**
 * Outside check: numpy (Debian's /usr/bin/python3) reads every exported .npy and .raw grid with the
 * manifest's dtype and shape and gets our values; hashlib's sha256 matches the manifest; the grid
 * mass numpy integrates equals the cloud mass. Sources: NumPy format 1.0 (NEP 1, "A Simple File
 * Format for NumPy Arrays"); SHA-256 (FIPS 180-4); mass = sum(rho) dx^3 (common practice).
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pythonJson } from '../helpers/python.js';
import { fixtureCloud } from '../helpers/export-cloud.js';
import { writeGridExports } from '../../src/export/grid-exports.js';
import type { IcManifest } from '../../src/export/ic-manifest.js';
import { readNpy } from '../../src/export/npy.js';
import { execFileSync } from 'node:child_process';
import { PYTHON } from '../helpers/python.js';
import { PC, M_SUN } from '../../src/physics/constants.js';

const META = { toolVersion: '0.1.0', seed: 11, configText: 'seed: 11\n', configSha256: '0'.repeat(64), name: 'npy-test' };

const READ_ALL = `
import sys, json, hashlib, numpy as np
a = json.load(sys.stdin)
m = json.load(open(a['dir'] + '/manifest.json'))
out = {}
for name, r in m['files'].items():
    p = a['dir'] + '/' + name
    raw = open(p, 'rb').read()
    dt = np.dtype('<f4' if r['dtype'] == 'float32' else '<f8')
    if r['format'] == 'npy':
        x = np.load(p)
    elif r['format'] == 'raw':
        x = np.fromfile(p, dtype=dt).reshape(r['shape'])
    else:
        out[name] = {'sha_ok': hashlib.sha256(raw).hexdigest() == r['sha256']}
        continue
    out[name] = {
        'sha_ok': hashlib.sha256(raw).hexdigest() == r['sha256'] and len(raw) == r['bytes'],
        'dtype_ok': x.dtype == dt, 'shape': list(x.shape), 'values': x.astype(np.float64).ravel().tolist(),
    }
d = np.load(a['dir'] + '/density.npy').astype(np.float64)
dx = m['grid']['cell_size_cm'] * m['unit_systems'][m['files']['density.npy']['unit_system']]['quantities']['length']['from_cgs']
out['mass_file_units'] = float(d.sum() * dx**3)
print(json.dumps(out))
`;

interface Read { sha_ok: boolean; dtype_ok: boolean; shape: number[]; values: number[] }

describe('numpy reads the .npy and .raw grids', () => {
  let dir: string;
  beforeAll(() => { dir = mkdtempSync(path.join(tmpdir(), 'fragplan-npy-')); return () => rmSync(dir, { recursive: true, force: true }); });

  it('float32 cgs: every file has the manifest dtype, shape, checksum and our values; mass is the cloud mass', async () => {
    const cloud = fixtureCloud({ n: 8, contrast: Infinity });
    const icDir = path.join(dir, 'a');
    const m: IcManifest = await writeGridExports(cloud, icDir, { formats: ['npy', 'raw'], precision: 'float32', units: 'cgs', thermalField: 'temperature', force: false }, META);
    const r = pythonJson<Record<string, Read> & { mass_file_units: number }>(READ_ALL, JSON.stringify({ dir: icDir }));
    const sources: Record<string, Float32Array> = {
      density: cloud.density, velocity_x: cloud.velocity[0], velocity_y: cloud.velocity[1], velocity_z: cloud.velocity[2],
      temperature: cloud.temperature, magnetic_x: cloud.magnetic![0], magnetic_y: cloud.magnetic![1], magnetic_z: cloud.magnetic![2],
    };
    expect(Object.keys(m.files).length).toBe(16);
    for (const [name, rec] of Object.entries(m.files)) {
      const got = r[name]!;
      expect(got.sha_ok, name).toBe(true);
      expect(got.dtype_ok, name).toBe(true);
      expect(got.shape).toEqual([8, 8, 8]);
      const src = sources[rec.contents]!;
      for (let q = 0; q < src.length; q++) expect(got.values[q]).toBe(src[q]); // float32 cgs: bit-identical
    }
    // empty ambient: everything on the grid is the cloud
    expect(Math.abs(r.mass_file_units / cloud.summary.mass - 1)).toBeLessThan(1e-6);
  });

  it('float64 code units: numpy values are ours times the manifest factor; mass in code units times M_unit is the cloud mass', async () => {
    const cloud = fixtureCloud({ n: 8 });
    const icDir = path.join(dir, 'b');
    const code = { length: 0.5 * PC.value, mass: 2 * M_SUN.value };
    const m = await writeGridExports(cloud, icDir, { formats: ['npy', 'raw'], precision: 'float64', units: 'code', codeUnits: code, thermalField: 'internal_energy', force: false }, META);
    const r = pythonJson<Record<string, Read> & { mass_file_units: number }>(READ_ALL, JSON.stringify({ dir: icDir }));
    const rec = m.files['density.npy']!;
    expect(rec.dtype).toBe('float64');
    const dens = r['density.npy']!.values;
    for (let q = 0; q < dens.length; q++) expect(Math.abs(dens[q]! * rec.to_cgs! - cloud.density[q]!)).toBeLessThanOrEqual(1e-12 * cloud.density[q]!);
    // u = (3/2) k_B T / (mu m_H), CODATA 2018 k_B = 1.380649e-16 erg/K, m_H = 1.6735575e-24 g (common practice)
    const u = r['internal_energy.raw']!.values;
    const uRec = m.files['internal_energy.raw']!;
    for (let q = 0; q < u.length; q += 41) {
      const expected = (1.5 * 1.380649e-16 * cloud.temperature[q]!) / (2.33 * 1.6735575e-24);
      expect(Math.abs(u[q]! * uRec.to_cgs! / expected - 1)).toBeLessThan(1e-12);
    }
    expect(Math.abs((r.mass_file_units * code.mass) / cloud.summary.massOnGrid - 1)).toBeLessThan(1e-9);
    for (const name of Object.keys(m.files)) expect(r[name]!.sha_ok, name).toBe(true);
  });

  it('our reader reads what numpy.save writes (float32 and float64, C order)', () => {
    const f32 = path.join(dir, 'np32.npy');
    const f64 = path.join(dir, 'np64.npy');
    execFileSync(PYTHON, ['-c', `import numpy as np; np.save('${f32}', np.arange(24, dtype='<f4').reshape(2, 3, 4) * 0.5); np.save('${f64}', np.linspace(-1, 1, 7))`]);
    const a = readNpy(f32);
    expect(a.dtype).toBe('float32');
    expect(a.shape).toEqual([2, 3, 4]);
    expect(Array.from(a.data)).toEqual(Array.from({ length: 24 }, (_, i) => i * 0.5));
    const b = readNpy(f64);
    expect(b.shape).toEqual([7]);
    expect(b.data[1]).toBeCloseTo(-1 + 2 / 6, 15);
  });
});
