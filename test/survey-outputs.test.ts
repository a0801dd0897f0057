import { describe, it, expect } from 'vitest';
import { surveyCloud } from '../src/survey/survey-cloud.js';
import { hierarchySummary, treeJson, fragmentsCsv } from '../src/survey/survey-outputs.js';
import { runEnsemble, ensembleSummary, meanSpread } from '../src/survey/ensemble.js';
import type { SurveyOptions, SurveyResult } from '../src/survey/types.js';

const M_SUN = 1.3271244e26 / 6.6743e-8; // IAU 2015 nominal GM_sun / CODATA 2018 G
const options: SurveyOptions = {
  jeansConvention: 'sphere', turbulentSupport: true, requireBound: false, connectivity: 6, minCells: 8, minContrast: 0.5,
  minMass: 0, floorDensity: 1e-19, gravityCells: 32, coreToStarEfficiency: 0.3, mach: 5, velocitySpectrumIndex: 4,
};

async function twoSpheres(): Promise<SurveyResult> {
  const n = 24, dx = 1.5e16, rho = 1e-17;
  const d = new Float32Array(n ** 3).fill(1e-21);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) {
    for (const [c, r] of [[6, 4], [17, 3]] as const) {
      const x = i + 0.5 - c, y = j + 0.5 - c, z = k + 0.5 - c;
      if (x * x + y * y + z * z < r * r) d[(i * n + j) * n + k] = rho;
    }
  }
  return surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: 10, mu: 2.33 }, options);
}

describe('survey outputs', () => {
  it('summarise the hierarchy with snake_case keys, masses in Msun and a null slope for few candidates', async () => {
    const r = await twoSpheres();
    const h = hierarchySummary(r);
    expect(h.nodes).toBe(r.nodes.length);
    expect(h.fragment_candidates).toBe(2);
    expect(h.expected_fragments).toBe(r.expectedFragments);
    expect(h.cmf_slope).toBeNull();
    expect(h.cmf_slope_error).toBeNull();
    expect((h.fragment_masses_msun as number[])[0]).toBeCloseTo(r.spectrum.masses[0]! / M_SUN, 4);
    expect(String(h.jeans_mass_definition)).toMatch(/^sphere/);
    expect(h.min_cells).toBe(8);
    expect(h.floor_density_gcc).toBe(1e-19);
  });

  it('write every node to tree.json and one csv row per candidate, heaviest first', async () => {
    const r = await twoSpheres();
    const t = treeJson(r) as { schema: string; nodes: Array<Record<string, unknown>> };
    expect(t.schema).toBe('fragplan.tree/1');
    expect(t.nodes.length).toBe(r.nodes.length);
    for (const key of ['id', 'parent', 'children', 'cells', 'mass_msun', 'merge_density_gcc', 'peak_density_gcc', 'gravitational_energy_erg', 'jeans_mass_msun', 'state']) {
      expect(t.nodes[0]).toHaveProperty(key);
    }
    const lines = fragmentsCsv(r).trim().split('\n');
    expect(lines[0]).toMatch(/^id,mass_msun,/);
    expect(lines.length).toBe(1 + r.candidates.length);
    const masses = lines.slice(1).map((l) => Number(l.split(',')[1]));
    expect(masses[0]).toBeGreaterThan(masses[1]!);
    expect(JSON.parse(JSON.stringify(t))).toEqual(t);
  });

  it('give model curves normalised to the number of candidates', async () => {
    const r = await twoSpheres();
    const names = r.spectrum.models.map((m) => m.name);
    expect(names.some((n) => n.startsWith('Padoan & Nordlund 2002'))).toBe(true);
    expect(names.some((n) => n.startsWith('Kroupa 2001'))).toBe(true);
  });
});

describe('ensembles', () => {
  it('give mean and sample standard deviation', () => {
    const s = meanSpread([1, 2, 3, 4]);
    expect(s.mean).toBe(2.5);
    expect(s.std).toBeCloseTo(Math.sqrt(5 / 3), 12);
    expect(meanSpread([]).n).toBe(0);
    expect(meanSpread([7]).std).toBe(0);
  });

  it('run each seed once and report the spread of the fragment count', async () => {
    const r = await twoSpheres();
    const seen: number[] = [];
    const stats = await runEnsemble(3, async (seed) => { seen.push(seed); return { ...r, candidates: r.candidates.slice(0, seed % 2 ? 1 : 2) }; }, [4, 5, 6]);
    expect(seen).toEqual([4, 5, 6]);
    expect(stats.candidates.mean).toBeCloseTo(5 / 3, 12);
    const block = ensembleSummary(stats);
    expect(block.realizations).toBe(3);
    await expect(runEnsemble(2, async () => r, [1])).rejects.toThrow(/seeds/);
  });
});
