/**
 * writeGridExports: the ic/ folder contract — refusal to overwrite, atomic writes, reproducible
 * bytes, manifest contents and checksums (sha256 recomputed here with node:crypto, FIPS 180-4).
 */
import { describe, expect, it, beforeEach, afterEach } from 'vitest';
import { mkdtempSync, rmSync, readdirSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fixtureCloud } from './helpers/export-cloud.js';
import { writeGridExports, type GridExportOptions } from '../src/export/grid-exports.js';
import { mergeManifests, type IcManifest } from '../src/export/ic-manifest.js';
import { InputError } from '../src/input-error.js';

const META = { toolVersion: '0.1.0', seed: 11, configText: 'seed: 11\ncloud: {}\n', configSha256: 'f'.repeat(64), name: 'grid-test' };
const ALL: GridExportOptions = { formats: ['npy', 'raw', 'hdf5', 'vti'], precision: 'float32', units: 'cgs', thermalField: 'temperature', particles: { count: 300, method: 'lattice' }, force: false };
const sha = (p: string): string => createHash('sha256').update(readFileSync(p)).digest('hex');

describe('writeGridExports', () => {
  let dir: string;
  beforeEach(() => { dir = mkdtempSync(path.join(tmpdir(), 'fragplan-ic-')); });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('with no formats and no particles writes only the manifest', async () => {
    const m = await writeGridExports(fixtureCloud({ n: 4 }), dir, { ...ALL, formats: [], particles: null }, META);
    expect(readdirSync(dir)).toEqual(['manifest.json']);
    expect(m.files).toEqual({});
  });

  it('a one-cell grid exports in every format', async () => {
    const m = await writeGridExports(fixtureCloud({ n: 1, radiusPc: 0.3 }), dir, ALL, META);
    expect(m.grid.shape).toEqual([1, 1, 1]);
    expect(m.files['density.raw']!.bytes).toBe(4);
    expect(existsSync(path.join(dir, 'cloud.h5'))).toBe(true);
  });

  it('every listed file exists with the recorded sha256 and size, and no temporary file is left', async () => {
    const m = await writeGridExports(fixtureCloud({ n: 8 }), dir, ALL, META);
    const onDisk = readdirSync(dir).sort();
    expect(onDisk).toEqual([...Object.keys(m.files), 'manifest.json'].sort());
    for (const [name, r] of Object.entries(m.files)) {
      expect(sha(path.join(dir, name)), name).toBe(r.sha256);
      expect(readFileSync(path.join(dir, name)).length).toBe(r.bytes);
    }
    const onFile = JSON.parse(readFileSync(path.join(dir, 'manifest.json'), 'utf8')) as IcManifest;
    expect(onFile).toEqual(JSON.parse(JSON.stringify(m)));
    expect(onFile.config_text).toBe(META.configText);
    expect(onFile.config_sha256).toBe(META.configSha256);
    expect(onFile.grid.centring).toMatch(/cell-centred; B cell-centred too/);
    expect(onFile.grid.endianness).toBe('little');
    expect(onFile.unit_systems.cgs).toBeDefined();
    expect(onFile.particles!.count).toBe(300);
  });

  it('refuses to replace existing files without force, before writing anything', async () => {
    writeFileSync(path.join(dir, 'velocity_y.raw'), 'mine');
    await expect(writeGridExports(fixtureCloud({ n: 4 }), dir, ALL, META)).rejects.toThrow(InputError);
    expect(readdirSync(dir)).toEqual(['velocity_y.raw']);
    expect(readFileSync(path.join(dir, 'velocity_y.raw'), 'utf8')).toBe('mine');
    await writeGridExports(fixtureCloud({ n: 4 }), dir, { ...ALL, force: true }, META);
    expect(readFileSync(path.join(dir, 'velocity_y.raw')).length).toBe(4 * 64);
  });

  it('the same cloud and seed give byte-identical files; another seed changes the particles only', async () => {
    const cloud = fixtureCloud({ n: 8 });
    const a = await writeGridExports(cloud, path.join(dir, 'a'), ALL, META);
    const b = await writeGridExports(cloud, path.join(dir, 'b'), ALL, META);
    const c = await writeGridExports({ ...cloud, seed: 12 }, path.join(dir, 'c'), ALL, META);
    expect(readFileSync(path.join(dir, 'a', 'manifest.json'))).toEqual(readFileSync(path.join(dir, 'b', 'manifest.json')));
    for (const name of Object.keys(a.files)) expect(b.files[name]!.sha256, name).toBe(a.files[name]!.sha256);
    expect(c.files['density.npy']!.sha256).toBe(a.files['density.npy']!.sha256);
    expect(c.files['particle_position.npy']!.sha256).not.toBe(a.files['particle_position.npy']!.sha256);
  });

  it('writes internal energy instead of temperature on request, and no magnetic files without a field', async () => {
    const m = await writeGridExports(fixtureCloud({ n: 4, magnetic: false }), dir, { ...ALL, formats: ['npy'], thermalField: 'internal_energy', particles: null }, META);
    expect(Object.keys(m.files).sort()).toEqual(['density.npy', 'internal_energy.npy', 'velocity_x.npy', 'velocity_y.npy', 'velocity_z.npy']);
    expect(m.thermal.field).toBe('internal_energy');
  });

  it('merging manifests keeps old files and replaces those written again', () => {
    const base = { files: { 'a.npy': { sha256: '1' }, 'b.npy': { sha256: '2' } }, unit_systems: { cgs: {} }, fields: {}, particles: null } as unknown as IcManifest;
    const next = { files: { 'b.npy': { sha256: '3' }, 'c.h5': { sha256: '4' } }, unit_systems: { code: {} }, fields: {}, particles: null } as unknown as IcManifest;
    const m = mergeManifests(base, next);
    expect(Object.keys(m.files)).toEqual(['a.npy', 'b.npy', 'c.h5']);
    expect(m.files['b.npy']!.sha256).toBe('3');
    expect(Object.keys(m.unit_systems).sort()).toEqual(['cgs', 'code']);
  });
});

describe('writeGridExports on worker threads', () => {
  it('writes the float32 .npy and .raw files of shared fields on the workers with the same bytes and manifest as here', async () => {
    const { createPool } = await import('../src/grid/pool.js');
    const base = fixtureCloud({ n: 8 });
    const share = (a: Float32Array): Float32Array => { const s = new Float32Array(new SharedArrayBuffer(a.byteLength)); s.set(a); return s; };
    const cloud = { ...base, density: share(base.density), temperature: share(base.temperature), velocity: base.velocity.map(share) as [Float32Array, Float32Array, Float32Array] };
    const dirs = [mkdtempSync(path.join(tmpdir(), 'fragplan-ic-here-')), mkdtempSync(path.join(tmpdir(), 'fragplan-ic-pool-'))];
    const pool = createPool(2);
    try {
      const opts: GridExportOptions = { ...ALL, formats: ['npy', 'raw'], particles: null };
      const here = await writeGridExports(cloud, dirs[0]!, opts, META);
      const there = await writeGridExports(cloud, dirs[1]!, { ...opts, pool }, META);
      expect(there.files).toEqual(here.files);
      expect(Object.keys(there.files)).toEqual(Object.keys(here.files)); // same order in manifest.json
      for (const f of Object.keys(here.files)) {
        expect(sha(path.join(dirs[1]!, f))).toBe(here.files[f]!.sha256);
        expect(readFileSync(path.join(dirs[1]!, f)).equals(readFileSync(path.join(dirs[0]!, f)))).toBe(true);
      }
      expect(readdirSync(dirs[1]!).filter((f) => f.endsWith('.tmp'))).toEqual([]);
      // an existing file is not replaced without force (the check runs before any worker writes)
      await expect(writeGridExports(cloud, dirs[1]!, { ...opts, pool }, META)).rejects.toThrow(/already exists/);
    } finally {
      await pool.close();
      for (const d of dirs) rmSync(d, { recursive: true, force: true });
    }
  });
});
