/**
 * `fragplan export <run dir> --format npy,hdf5,raw,vti [--particles N] [--units cgs|si|code]`:
 * more initial-condition files from a finished plan run.
 *
 * Source of the full-resolution fields: the run's own ic/ grids (.npy, else .raw), read back with
 * ic/manifest.json (dtype, shape, unit factors) and checked against its sha256 sums, then
 * converted to cgs Float32 — exactly the Cloud that plan exported, without regenerating it
 * (no generator run, no dependence on the generator's version; the cloud summary is stored in
 * the manifest). Fields stored at float32 in cgs come back bit-identical; other units or float64
 * round-trip to within float32 rounding. New files are written into ic/ beside the old ones
 * (existing files are replaced only with --force) and the manifest is updated to list them all.
 * Grid conventions: C order (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3.
 */
import path from 'node:path';
import { InputError } from '../input-error.js';
import { parseConfigText } from '../config/load.js';
import type { ProgressSink } from '../progress.js';
import { silentProgress } from '../progress.js';
import { readIcCloud, readIcManifest } from '../export/manifest-read.js';
import { GRID_FORMATS, writeGridExports, type GridFormat } from '../export/grid-exports.js';
import type { ParticleMethod, ParticleReport } from '../export/particles.js';
import type { UnitSystemName } from '../export/unit-system.js';
import { assertFits } from './memory-guard.js';
import { PC, M_SUN } from '../physics/constants.js';

/** Options of `fragplan export`. */
export interface ExportOptions {
  formats: string[];
  particles?: number;
  method?: string;
  units?: 'cgs' | 'si' | 'code';
  precision?: string;
  force: boolean;
}

/** What runExport wrote. */
export interface ExportResult {
  run_dir: string;
  ic_dir: string;
  source: string;
  formats: GridFormat[];
  units: UnitSystemName;
  precision: 'float32' | 'float64';
  files: string[];
  particles: ParticleReport | null;
  manifest: string;
}

/** Writes more ic/ exports of a plan run (see the file comment); InputError for bad options or a bad run folder. */
export async function runExport(runDir: string, opts: ExportOptions, progress: ProgressSink = silentProgress): Promise<ExportResult> {
  const formats = opts.formats.map((f) => f.trim().toLowerCase()).filter(Boolean);
  if (!formats.length) throw new InputError('--format: expected a comma list of npy, hdf5, raw, vti');
  for (const f of formats) if (!(GRID_FORMATS as readonly string[]).includes(f)) throw new InputError(`--format: "${f}" is not one of npy, hdf5, raw, vti`);
  const method = opts.method ?? 'lattice';
  if (method !== 'lattice' && method !== 'monte-carlo') throw new InputError(`--method: expected lattice or monte-carlo, got "${method}"`);
  const units = opts.units ?? 'cgs';
  if (!['cgs', 'si', 'code'].includes(units)) throw new InputError(`--units: expected cgs, si or code, got "${String(units)}"`);
  const precision = opts.precision ?? 'float32';
  if (precision !== 'float32' && precision !== 'float64') throw new InputError(`--precision: expected float32 or float64, got "${precision}"`);
  if (opts.particles !== undefined && (!Number.isInteger(opts.particles) || opts.particles < 1 || opts.particles > 200_000_000)) {
    throw new InputError(`--particles: expected a whole number from 1 to 200000000, got ${opts.particles}`);
  }

  const { manifest, manifestFile, icDir } = readIcManifest(runDir);
  const [nx, ny, nz] = manifest.grid.shape;
  const cells = nx * ny * nz;
  const np = opts.particles ?? 0;
  // fields (8 x float32) + one file read buffer (float64) + particles (8 doubles + 1 int each, plus a converted copy)
  assertFits(`export of ${nx}x${ny}x${nz} cells${np ? ` and ${np} particles` : ''}`, cells * (8 * 4 + 8 + 4) + np * (8 * 8 + 4 + 6 * 8) + 256 * 2 ** 20);

  // code units, thermal field and particle-code settings come from the run's config
  let codeUnits = { length: PC.value, mass: M_SUN.value };
  let thermal: 'temperature' | 'internal_energy' = 'temperature';
  let neighbours: number | undefined;
  let resolvableFactor: number | undefined;
  let eta: number | undefined;
  if (manifest.config_text) {
    const config = parseConfigText(manifest.config_text, `${manifestFile} (config_text)`);
    codeUnits = { length: config.export.code_units.length, mass: config.export.code_units.mass };
    thermal = config.export.thermal_field;
    neighbours = config.budget.particles.neighbours;
    resolvableFactor = config.budget.particles.resolvable_factor;
    eta = config.budget.particles.eta;
  }

  const st = progress.stage('reading ic/ grids', 1);
  const cloud = await readIcCloud(manifest, icDir, manifestFile);
  st.update(1);
  st.stop();
  const written: string[] = [];
  const out = await writeGridExports(cloud, icDir, {
    formats: formats as GridFormat[], precision, units, codeUnits, thermalField: thermal,
    particles: np ? { count: np, method: method as ParticleMethod, neighbours, resolvableFactor, eta } : null,
    force: opts.force, previous: manifest, onWritten: (name) => written.push(name),
  }, {
    toolVersion: manifest.tool_version, seed: manifest.seed, configText: manifest.config_text,
    configSha256: manifest.config_sha256, name: manifest.name,
  }, progress);
  return {
    run_dir: runDir, ic_dir: icDir, source: 'ic/ grids listed in manifest.json (sha256 checked)',
    formats: formats as GridFormat[], units, precision, files: written.map((f) => path.join('ic', f)),
    particles: np ? out.particles : null, manifest: path.join(icDir, 'manifest.json'),
  };
}
