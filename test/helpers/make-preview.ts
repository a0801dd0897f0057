/**
 * Test fixture: a small synthetic run for the viewer, the server and the report tests.
 * A 32^3 cloud (box [-L/2, L/2)^3, C order (i*n + j)*n + k, i along x, cell-centred) with two
 * dense Gaussian blobs, a 7-node tree, two fragment candidates, and a preview.zip built with
 * jszip following src/export/preview-layout.ts exactly. Values are invented, not physics results.
 */
import JSZip from 'jszip';
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { PreviewManifest } from '../../src/export/preview-layout.js';
import type { PlotData, TreePlotNode } from '../../src/report/plot-data.js';
import type { Summary } from '../../src/report/summary-types.js';

export const FIXTURE_CELLS = 32;
export const FIXTURE_BOX_PC = 2;

/** Blob centres in pc and their peak over-densities. */
export const BLOBS = [
  { centre: [-0.45, -0.1, 0.05] as const, width: 0.12, peak: 300, node: 0 },
  { centre: [0.5, 0.3, -0.2] as const, width: 0.1, peak: 150, node: 1 },
];

const RHO0 = 2e-20;

/** The seven tree nodes: 0 and 1 are the candidates (blob cores), 2 a small stable bump. */
export function fixtureTree(): TreePlotNode[] {
  return [
    { id: 0, parent: 3, mass_msun: 12.5, merge_density_gcc: 6e-19, peak_density_gcc: 6e-18, state: 'bound-unstable', candidate: true },
    { id: 1, parent: 4, mass_msun: 4.75, merge_density_gcc: 4e-19, peak_density_gcc: 3e-18, state: 'unstable', candidate: true },
    { id: 2, parent: 3, mass_msun: 0.8, merge_density_gcc: 6e-19, peak_density_gcc: 9e-19, state: 'stable', candidate: false },
    { id: 3, parent: 5, mass_msun: 20.2, merge_density_gcc: 1.2e-19, peak_density_gcc: 6e-18, state: 'bound-unstable', candidate: false },
    { id: 4, parent: 5, mass_msun: 8.1, merge_density_gcc: 1.2e-19, peak_density_gcc: 3e-18, state: 'unstable', candidate: false },
    { id: 5, parent: 6, mass_msun: 35.0, merge_density_gcc: 6e-20, peak_density_gcc: 6e-18, state: 'stable', candidate: false },
    { id: 6, parent: -1, mass_msun: 52.0, merge_density_gcc: 3e-20, peak_density_gcc: 6e-18, state: 'stable', candidate: false },
  ];
}

/** The fixture's summary.json. */
export function fixtureSummary(): Summary {
  return {
    schema: 'fragplan.summary/1',
    tool_version: '0.1.0',
    seed: 7,
    config_sha256: 'ab'.repeat(32),
    name: 'two-blobs',
    cloud: {
      mass_msun: 60.25, radius_pc: 0.8, temperature_k: 10, mu: 2.33, mean_density_gcc: 1.9e-20,
      sound_speed_kms: 0.188, mach: 5.5, virial_parameter: 1.37, alpha_thermal: 0.0912, beta_rotation: 0,
      jeans_mass_msun: 3.14159, jeans_length_pc: 0.2468, free_fall_time_myr: 0.4823, jeans_mass_definition: 'sphere: diameter lambda_J',
    },
    grid: { cells_per_side: 32, box_size_pc: FIXTURE_BOX_PC, cell_size_pc: FIXTURE_BOX_PC / 32, mass_on_grid_msun: 61.07 },
    resolution: {
      jeans_cells_min: 2.714, unresolved_mass_fraction: 0.0316, max_resolved_density_gcc: 1.234e-19,
      levels_needed: 3, sink_threshold_gcc: 5.55e-18, sink_radius_pc: 0.15625,
      verdict: 'not resolved',
      verdict_reason: 'the densest cell has 2.71 cells per Jeans length, below the 4 of Truelove et al. 1997',
    },
    hierarchy: {
      nodes: 7, unstable_nodes: 4, fragment_candidates: 2, expected_fragments: 5,
      fragment_masses_msun: [12.5, 4.75], cmf_slope: null,
    },
    cost: { core_hours: 1234.5, memory_gib: 3.2 },
    warnings: ['grid under-resolves the densest gas <by design of this fixture> & more'],
    cautions: ['Statistical preview: not a simulation.'],
    timings_s: { generate: 0.1 },
  };
}

/** The fixture's plots.json. */
export function fixturePlots(): PlotData {
  const s: number[] = [];
  const pdf: number[] = [];
  for (let i = 0; i < 40; i++) {
    const x = -4 + (8 * (i + 0.5)) / 40;
    s.push(x);
    pdf.push(Math.exp(-((x + 0.5) ** 2) / 2) / Math.sqrt(2 * Math.PI) + 1e-4);
  }
  const k = [1, 2, 3, 4, 6, 8, 11, 16];
  return {
    schema: 'fragplan.plots/1',
    density_pdf: { s, pdf, rho0_gcc: RHO0, sigma_s_measured: 0.98, sigma_s_expected: 1.0 },
    velocity_spectrum: { k, power: k.map((x) => 10 * x ** -4), input_index: 4, k_min: 2, k_max: 16 },
    jeans_histogram: { log10_j_edges: [-2, -1.5, -1, -0.5, 0], counts: [20000, 9000, 2700, 68], limit: 0.25, cells_per_jeans_length: 4 },
    mass_spectrum: {
      masses_msun: [12.5, 4.75],
      fit: null,
      models: [{ name: 'Salpeter 1955 (slope 2.35)', masses_msun: [1, 10, 100], dn_dlogm: [4, 0.18, 0.008] }],
    },
    tree: fixtureTree(),
  };
}

/** Synthetic fields of the fixture: density (g/cm^3), Jeans number and labels, n^3 each. */
export function fixtureFields(n = FIXTURE_CELLS): { density: Float32Array; jeans: Float32Array; labels: Int32Array } {
  const density = new Float32Array(n ** 3);
  const jeans = new Float32Array(n ** 3);
  const labels = new Int32Array(n ** 3).fill(-1);
  const dx = FIXTURE_BOX_PC / n;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      for (let k = 0; k < n; k++) {
        const x = -FIXTURE_BOX_PC / 2 + (i + 0.5) * dx;
        const y = -FIXTURE_BOX_PC / 2 + (j + 0.5) * dx;
        const z = -FIXTURE_BOX_PC / 2 + (k + 0.5) * dx;
        let rho = RHO0 * 0.5;
        let best = -1;
        let bestOver = 0;
        for (const b of BLOBS) {
          const r2 = (x - b.centre[0]) ** 2 + (y - b.centre[1]) ** 2 + (z - b.centre[2]) ** 2;
          const over = b.peak * Math.exp(-r2 / (2 * b.width ** 2));
          rho += RHO0 * over;
          if (over > bestOver) {
            bestOver = over;
            best = b.node;
          }
        }
        const c = (i * n + j) * n + k;
        density[c] = rho;
        jeans[c] = 0.02 * Math.sqrt(rho / RHO0); // J grows as sqrt(rho) at fixed temperature
        if (bestOver > 30) labels[c] = best;
        else if (bestOver > 6) labels[c] = best === 0 ? 3 : 4;
        else if (rho > RHO0 * 2) labels[c] = 5;
        else if (rho > RHO0 * 1.5) labels[c] = 6;
      }
    }
  }
  return { density, jeans, labels };
}

function minMax(a: ArrayLike<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < a.length; i++) {
    if (a[i] < lo) lo = a[i];
    if (a[i] > hi) hi = a[i];
  }
  return [lo, hi];
}

function bytes(a: Float32Array | Int32Array): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength); // little-endian on x86/ARM hosts
}

/** Builds the fixture preview.zip in memory (optionally with particles and a chosen fragments.csv). */
export async function makePreviewZip(opts: { particles?: boolean; fragmentsCsv?: string } = {}): Promise<Buffer> {
  const n = FIXTURE_CELLS;
  const { density, jeans, labels } = fixtureFields(n);
  const [dmin, dmax] = minMax(density);
  const [jmin, jmax] = minMax(jeans);
  const [lmin, lmax] = minMax(labels);
  let particles: Float32Array | null = null;
  if (opts.particles) {
    particles = new Float32Array(3 * 500);
    for (let p = 0; p < 500; p++) {
      const b = BLOBS[p % 2];
      for (let a = 0; a < 3; a++) particles[3 * p + a] = b.centre[a] + b.width * Math.sin(p * (a + 1.7));
    }
  }
  const manifest: PreviewManifest = {
    schema: 'fragplan.preview/1',
    cells: n,
    source_cells: 64,
    box_size_pc: FIXTURE_BOX_PC,
    axis_order: 'C order (i*n + j)*n + k, i along x',
    fields: {
      density: { file: 'density.f32', dtype: 'float32', unit: 'g cm^-3', min: dmin, max: dmax },
      jeans: { file: 'jeans.f32', dtype: 'float32', unit: '', min: jmin, max: jmax },
      labels: { file: 'labels.i32', dtype: 'int32', unit: '', min: lmin, max: lmax },
    },
    particles: particles ? { file: 'particles.f32', count: particles.length / 3, unit: 'pc' } : null,
    tool_version: '0.1.0',
    seed: 7,
  };
  const zip = new JSZip();
  const date = new Date(Date.UTC(2020, 0, 1));
  zip.file('preview.json', JSON.stringify(manifest, null, 2), { date });
  zip.file('density.f32', bytes(density), { date });
  zip.file('jeans.f32', bytes(jeans), { date });
  zip.file('labels.i32', bytes(labels), { date });
  if (particles) zip.file('particles.f32', bytes(particles), { date });
  zip.file('summary.json', JSON.stringify(fixtureSummary(), null, 2), { date });
  zip.file('tree.json', JSON.stringify({ nodes: fixtureTree() }, null, 2), { date });
  const csv =
    opts.fragmentsCsv ??
    ['id,mass_msun,x_pc,y_pc,z_pc,state', ...BLOBS.map((b, i) => `${b.node},${fixtureTree()[i].mass_msun},${b.centre.join(',')},${fixtureTree()[i].state}`)].join('\n') + '\n';
  zip.file('fragments.csv', csv, { date });
  zip.file('plots.json', JSON.stringify(fixturePlots(), null, 2), { date });
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
}

/** Writes a fixture run folder (preview.zip, summary.json, report-free) under `dir`; returns `dir`. */
export async function writeFixtureRun(dir: string, opts: { particles?: boolean; report?: string } = {}): Promise<string> {
  mkdirSync(dir, { recursive: true });
  writeFileSync(path.join(dir, 'preview.zip'), await makePreviewZip(opts));
  writeFileSync(path.join(dir, 'summary.json'), JSON.stringify(fixtureSummary(), null, 2));
  if (opts.report !== undefined) writeFileSync(path.join(dir, 'report.html'), opts.report);
  return dir;
}
