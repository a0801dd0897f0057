import { describe, it, expect, beforeAll } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync, statSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { fragplan } from './helpers/cli.js';

function filesUnder(dir: string, base = dir): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = path.join(dir, f);
    return statSync(p).isDirectory() ? filesUnder(p, base) : [path.relative(base, p)];
  }).sort();
}

function digest(dir: string, file: string): string {
  let data: Buffer | string = readFileSync(path.join(dir, file));
  if (file === 'summary.json') {
    const s = JSON.parse(data.toString());
    delete s.timings_s; // wall-clock times are the one documented difference between runs
    data = JSON.stringify(s);
  }
  return createHash('sha256').update(data).digest('hex');
}

const tmp = mkdtempSync(path.join(tmpdir(), 'fragplan-plan-'));
const preset = 'presets/massive-clump.yaml';

describe('fragplan plan, end to end', () => {
  let a: ReturnType<typeof fragplan>;
  beforeAll(() => {
    a = fragplan(['plan', preset, '--cells', '32', '--seed', '5', '--out', path.join(tmp, 'a'), '--quiet']);
  });

  it('writes the run folder of the design', () => {
    expect(a.stderr).toBe('');
    expect(a.status).toBe(0);
    const files = filesUnder(path.join(tmp, 'a'));
    for (const f of ['summary.json', 'tree.json', 'fragments.csv', 'report.html', 'preview.zip', 'ic/manifest.json', 'ic/density.npy']) expect(files).toContain(f);
    expect(files.some((f) => f.endsWith('.tmp'))).toBe(false);
  });

  it('summary.json holds the keys the design lists', () => {
    const s = JSON.parse(readFileSync(path.join(tmp, 'a', 'summary.json'), 'utf8'));
    expect(s.schema).toBe('fragplan.summary/1');
    for (const k of ['mass_msun', 'radius_pc', 'temperature_k', 'mu', 'mean_density_gcc', 'sound_speed_kms', 'mach', 'virial_parameter', 'alpha_thermal', 'beta_rotation', 'jeans_mass_msun', 'jeans_length_pc', 'free_fall_time_myr', 'jeans_mass_definition']) expect(s.cloud).toHaveProperty(k);
    for (const k of ['cells_per_side', 'box_size_pc', 'cell_size_pc', 'mass_on_grid_msun']) expect(s.grid).toHaveProperty(k);
    for (const k of ['jeans_cells_min', 'unresolved_mass_fraction', 'max_resolved_density_gcc', 'levels_needed', 'sink_threshold_gcc', 'sink_radius_pc']) expect(s.resolution).toHaveProperty(k);
    for (const k of ['nodes', 'unstable_nodes', 'fragment_candidates', 'expected_fragments', 'fragment_masses_msun', 'cmf_slope']) expect(s.hierarchy).toHaveProperty(k);
    expect(s.grid.cells_per_side).toBe(32);
    expect(s.seed).toBe(5);
    expect(s.config_sha256).toBe(createHash('sha256').update(readFileSync(preset)).digest('hex'));
    expect(s.cautions.join(' ')).toMatch(/not a simulation/);
  });

  it('the same config and seed give the same bytes; another seed does not', () => {
    const b = fragplan(['plan', preset, '--cells', '32', '--seed', '5', '--out', path.join(tmp, 'b'), '--quiet']);
    expect(b.status).toBe(0);
    const c = fragplan(['plan', preset, '--cells', '32', '--seed', '6', '--out', path.join(tmp, 'c'), '--quiet']);
    expect(c.status).toBe(0);
    const files = filesUnder(path.join(tmp, 'a'));
    expect(filesUnder(path.join(tmp, 'b'))).toEqual(files);
    for (const f of files) expect(digest(path.join(tmp, 'b'), f), f).toBe(digest(path.join(tmp, 'a'), f));
    expect(digest(path.join(tmp, 'c'), 'ic/density.npy')).not.toBe(digest(path.join(tmp, 'a'), 'ic/density.npy'));
  });

  it('never overwrites an earlier run without --force', () => {
    const before = readFileSync(path.join(tmp, 'a', 'summary.json'));
    const r = fragplan(['plan', preset, '--cells', '32', '--out', path.join(tmp, 'a'), '--quiet']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--out .*earlier run.*--force/);
    expect(readFileSync(path.join(tmp, 'a', 'summary.json')).equals(before)).toBe(true);
  });

  it('--json prints the summary on stdout and nothing else', () => {
    const r = fragplan(['plan', preset, '--cells', '16', '--out', path.join(tmp, 'j'), '--json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.grid.cells_per_side).toBe(16);
  });
});

describe('bad input exits 2 with one line naming the key or file', () => {
  const cases: Array<[string, RegExp]> = [
    ['test/data/bad-unit.yaml', /cloud\.mass: expected mass/],
    ['test/data/unknown-key.yaml', /cloud: unknown key "raduis"/],
    ['test/data/negative-mass.yaml', /cloud\.mass: expected a positive value/],
    ['test/data/odd-cells.yaml', /grid\.cells: expected a power of two/],
    ['test/data/no-such-file.yaml', /no-such-file\.yaml: cannot read config \(no such file\)/],
  ];
  for (const [file, pattern] of cases) {
    it(`${file}`, () => {
      const r = fragplan(['plan', file, '--out', path.join(tmp, 'bad')]);
      expect(r.status).toBe(2);
      expect(r.stderr).toMatch(pattern);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).not.toMatch(/\n\s+at /);
      expect(existsSync(path.join(tmp, 'bad'))).toBe(false);
    });
  }

  it('a bad option value', () => {
    const r = fragplan(['plan', preset, '--cells', 'many']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--cells expects a positive integer/);
  });

  it('cells not a power of two on the command line', () => {
    const r = fragplan(['plan', preset, '--cells', '48', '--out', path.join(tmp, 'bad2')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/power of two/);
  });

  it('a broken YAML file', () => {
    const f = path.join(tmp, 'broken.yaml');
    writeFileSync(f, 'cloud: [oops\n');
    const r = fragplan(['plan', f]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/broken\.yaml: not valid YAML/);
  });
});

describe('the memory guard', () => {
  it('refuses a 2048^3 plan up front with the estimate, exit 2', () => {
    const r = fragplan(['plan', preset, '--cells', '2048', '--out', path.join(tmp, 'huge')], { FRAGPLAN_MEMORY_LIMIT_GB: '16' });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/needs about [\d.]+ GiB of memory, more than the 16\.0 GiB available/);
    expect(existsSync(path.join(tmp, 'huge'))).toBe(false);
  });
});

describe('budget and plan agree', () => {
  it('on every resolution and cost number they both report', () => {
    const p = JSON.parse(fragplan(['plan', 'presets/quiescent-core.yaml', '--cells', '32', '--out', path.join(tmp, 'agree'), '--json']).stdout);
    const b = JSON.parse(fragplan(['budget', 'presets/quiescent-core.yaml', '--cells', '32', '--json']).stdout);
    let compared = 0;
    for (const block of ['resolution', 'cost'] as const) {
      for (const [k, v] of Object.entries(b[block] as Record<string, unknown>)) {
        if (!(k in p[block])) continue;
        expect(p[block][k], `${block}.${k}`).toEqual(v);
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(10);
  });
});

describe('a bound region below its mean-density Jeans mass', () => {
  it('is flagged in the warnings (a near-critical Bonnor–Ebert core: M/M_J ~ 0.6 at its mean density, Bonnor 1956)', () => {
    const out = path.join(tmp, 'be');
    const r = fragplan(['plan', 'presets/be-core.yaml', '--cells', '32', '--out', out, '--quiet']);
    expect(r.status).toBe(0);
    const tree = JSON.parse(readFileSync(path.join(out, 'tree.json'), 'utf8'));
    const s = JSON.parse(readFileSync(path.join(out, 'summary.json'), 'utf8'));
    const roots = (tree.nodes as Array<{ id: number; parent: number; bound: boolean; unstable: boolean }>).filter((n) => n.parent === -1);
    const flagged = roots.filter((n) => n.bound && !n.unstable);
    expect(flagged.length).toBeGreaterThan(0);
    for (const n of flagged) expect((s.warnings as string[]).some((w) => w.startsWith(`region #${n.id} `) && /bound but below its Jeans mass/.test(w))).toBe(true);
  });
});
