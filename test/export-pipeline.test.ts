/**
 * runExport (`fragplan export <run dir>`): reads the run's ic/ grids back through the manifest
 * (checksums verified), writes the requested formats beside them and updates the manifest.
 * Bad options and bad run folders give InputError naming the option or file.
 */
import { describe, expect, it, beforeEach, afterEach } from 'vitest';
import { mkdtempSync, rmSync, readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fixtureCloud } from './helpers/export-cloud.js';
import { writeGridExports } from '../src/export/grid-exports.js';
import { runExport } from '../src/pipeline/export.js';
import { readIcCloud, readIcManifest } from '../src/export/manifest-read.js';
import { decodeNpy } from '../src/export/npy.js';
import { InputError } from '../src/input-error.js';
import { PC, M_SUN } from '../src/physics/constants.js';

const CONFIG = 'cloud:\n  mass: 10 Msun\n  radius: 0.15 pc\n  temperature: 10 K\nexport:\n  code_units:\n    length: 0.5 pc\n    mass: 2 Msun\n  thermal_field: internal_energy\n';
const META = { toolVersion: '0.1.0', seed: 11, configText: CONFIG, configSha256: 'a'.repeat(64), name: 'pipeline-test' };

describe('runExport', () => {
  let run: string;
  const cloud = fixtureCloud({ n: 8 });
  beforeEach(async () => {
    run = mkdtempSync(path.join(tmpdir(), 'fragplan-run-'));
    await writeGridExports(cloud, path.join(run, 'ic'), { formats: ['npy'], precision: 'float32', units: 'cgs', thermalField: 'temperature', force: false }, META);
  });
  afterEach(() => rmSync(run, { recursive: true, force: true }));

  it('reads the float32 cgs grids back bit-identical', async () => {
    const { manifest, icDir, manifestFile } = readIcManifest(run);
    const back = await readIcCloud(manifest, icDir, manifestFile);
    expect(back.grid).toEqual(cloud.grid);
    expect(back.density).toEqual(cloud.density);
    expect(back.velocity[1]).toEqual(cloud.velocity[1]);
    expect(back.temperature).toEqual(cloud.temperature);
    expect(back.magnetic![2]).toEqual(cloud.magnetic![2]);
    expect(back.summary).toEqual(cloud.summary);
  });

  it('adds raw grids in code units (from the config) and particles, and lists old and new files', async () => {
    const r = await runExport(run, { formats: ['raw'], particles: 500, method: 'monte-carlo', units: 'code', precision: 'float64', force: false });
    expect(r.files).toContain(path.join('ic', 'density.raw'));
    expect(r.files).toContain(path.join('ic', 'internal_energy.raw'));
    expect(r.files).toContain(path.join('ic', 'particle_mass.npy'));
    expect(r.particles!.count).toBe(500);
    const m = JSON.parse(readFileSync(path.join(run, 'ic', 'manifest.json'), 'utf8'));
    expect(m.files['density.npy'].unit_system).toBe('cgs');
    expect(m.files['density.raw'].unit_system).toBe('code');
    expect(m.unit_systems.code.code_units_cgs.length_cm).toBeCloseTo(0.5 * PC.value, -4);
    // density.raw = cgs density / (M/L^3) with the config's code units
    const raw = new Float64Array(new Uint8Array(readFileSync(path.join(run, 'ic', 'density.raw'))).buffer);
    const unit = (2 * M_SUN.value) / (0.5 * PC.value) ** 3;
    for (let q = 0; q < raw.length; q++) expect(Math.abs((raw[q]! * unit) / cloud.density[q]! - 1)).toBeLessThan(1e-6);
    const pm = decodeNpy(readFileSync(path.join(run, 'ic', 'particle_mass.npy')));
    expect(pm.shape).toEqual([500]);
  });

  it('refuses to replace existing grids without force', async () => {
    await expect(runExport(run, { formats: ['npy'], force: false })).rejects.toThrow(/already exists/);
    const r = await runExport(run, { formats: ['npy'], force: true });
    expect(r.files.length).toBe(8);
  });

  it('reports a changed grid file as a checksum mismatch', async () => {
    const f = path.join(run, 'ic', 'velocity_x.npy');
    const b = readFileSync(f);
    b[b.length - 1] ^= 1;
    writeFileSync(f, b);
    await expect(runExport(run, { formats: ['vti'], force: false })).rejects.toThrow(/velocity_x.npy: size or sha256 differs/);
  });

  it('gives InputError naming the missing manifest or the bad option', async () => {
    const empty = mkdtempSync(path.join(tmpdir(), 'fragplan-empty-'));
    try {
      await expect(runExport(empty, { formats: ['npy'], force: false })).rejects.toThrow(/ic\/manifest.json: not found/);
      mkdirSync(path.join(empty, 'ic'));
      writeFileSync(path.join(empty, 'ic', 'manifest.json'), '{oops');
      await expect(runExport(empty, { formats: ['npy'], force: false })).rejects.toThrow(/manifest.json: not valid JSON/);
    } finally {
      rmSync(empty, { recursive: true, force: true });
    }
    await expect(runExport(path.join(run, 'nope'), { formats: ['npy'], force: false })).rejects.toThrow(InputError);
    await expect(runExport(run, { formats: ['fits'], force: false })).rejects.toThrow(/--format: "fits"/);
    await expect(runExport(run, { formats: ['hdf5'], units: 'imperial' as 'cgs', force: false })).rejects.toThrow(/--units/);
    await expect(runExport(run, { formats: ['hdf5'], precision: 'float16', force: false })).rejects.toThrow(/--precision/);
    await expect(runExport(run, { formats: ['hdf5'], method: 'glass', particles: 10, force: false })).rejects.toThrow(/--method/);
    await expect(runExport(run, { formats: ['hdf5'], particles: 0, force: false })).rejects.toThrow(/--particles/);
  });
});
