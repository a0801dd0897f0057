/**
 * report.html (renderReport): a well-formed, self-contained page with one SVG per plot, whose key
 * numbers equal summary.json's, with the config escaped and the cautions shown.
 */
import { describe, expect, it } from 'vitest';
import { renderReport } from '../src/report/html-report.js';
import type { PlotData } from '../src/report/plot-data.js';
import type { Summary } from '../src/report/summary-types.js';
import { fixturePlots, fixtureSummary } from './helpers/make-preview.js';
import { pythonJson } from './helpers/python.js';

const VOID = new Set(['meta', 'link', 'br', 'hr', 'img', 'input', 'area', 'base', 'col', 'source', 'wbr']);

/** Small well-formedness check: every non-void tag closed in order; returns the problems found. */
function tagProblems(html: string): string[] {
  const problems: string[] = [];
  const body = html.replace(/<!DOCTYPE html>/i, '').replace(/<!--[\s\S]*?-->/g, '');
  const stack: string[] = [];
  // raw-text elements: skip their content
  const re = /<(\/?)([a-zA-Z][\w:-]*)((?:\s+[^\s=>/]+(?:="[^"]*")?)*)\s*(\/?)>|<(?![a-zA-Z/!])/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(body))) {
    if (m[2] === undefined) {
      problems.push(`stray "<" at ${m.index}`);
      continue;
    }
    const [, close, nameRaw, , self] = m;
    const name = nameRaw.toLowerCase();
    if (close) {
      const top = stack.pop();
      if (top !== name) problems.push(`</${name}> closes <${top}> at ${m.index}`);
    } else if (!self && !VOID.has(name)) {
      stack.push(name);
      if (name === 'style') {
        const end = body.indexOf('</style>', re.lastIndex);
        re.lastIndex = end;
      }
    }
  }
  if (stack.length) problems.push(`unclosed: ${stack.join(', ')}`);
  // every attribute value quoted: no bare = inside tags
  for (const t of body.match(/<[a-zA-Z][^>]*>/g) ?? []) if (/=[^"\s]/.test(t.replace(/"[^"]*"/g, '""'))) problems.push(`unquoted attribute in ${t.slice(0, 60)}`);
  return problems;
}

const CONFIG = 'name: two-blobs\ncloud:\n  mass: "60 Msun"  # <script>alert(1)</script> & "quotes"\n';

describe('renderReport', () => {
  const summary = fixtureSummary();
  const html = renderReport(summary, fixturePlots(), CONFIG);

  it('is a well-formed HTML5 document (doctype, balanced tags, quoted attributes)', () => {
    expect(html.startsWith('<!DOCTYPE html>\n<html lang="en">')).toBe(true);
    expect(html).toContain('<meta charset="utf-8">');
    expect(tagProblems(html)).toEqual([]);
    // the checker itself catches a broken page
    expect(tagProblems('<div><span></div>').length).toBeGreaterThan(0);
  });

  it('has exactly one <svg> per plot, each well-formed XML (python xml.etree)', () => {
    const svgs = html.match(/<svg[\s\S]*?<\/svg>/g) ?? [];
    expect(svgs.length).toBe(5);
    const ids = svgs.map((s) => /id="([^"]+)"/.exec(s)?.[1]);
    expect(ids).toEqual(['plot-density-pdf', 'plot-velocity-spectrum', 'plot-jeans-histogram', 'plot-mass-spectrum', 'plot-tree']);
    // XML 1.0 well-formedness by the Python standard library's parser (common practice)
    const ok = pythonJson<boolean[]>(
      'import sys, json, xml.etree.ElementTree as ET\nres=[]\nfor s in json.load(sys.stdin):\n  try:\n    ET.fromstring(s); res.append(True)\n  except Exception as e:\n    res.append(str(e))\nprint(json.dumps(res))',
      JSON.stringify(svgs),
    );
    expect(ok).toEqual([true, true, true, true, true]);
  });

  it('needs no network: no scripts, no external links, no url() or src', () => {
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<link/i);
    expect(html).not.toMatch(/\bsrc=/i);
    expect(html).not.toMatch(/url\(/i);
    const urls = html.match(/https?:\/\/[^\s"'<)]+/g) ?? [];
    expect(urls.every((u) => u === 'http://www.w3.org/2000/svg')).toBe(true);
  });

  it('shows every key number of summary.json to 3 significant figures', () => {
    const keys: Array<[keyof Summary, string[]]> = [
      ['cloud', ['mass_msun', 'radius_pc', 'temperature_k', 'mean_density_gcc', 'mach', 'virial_parameter', 'jeans_mass_msun', 'jeans_length_pc', 'free_fall_time_myr']],
      ['grid', ['cells_per_side', 'box_size_pc', 'cell_size_pc', 'mass_on_grid_msun']],
      ['resolution', ['jeans_cells_min', 'unresolved_mass_fraction', 'max_resolved_density_gcc', 'levels_needed', 'sink_threshold_gcc', 'sink_radius_pc']],
      ['hierarchy', ['nodes', 'unstable_nodes', 'fragment_candidates', 'expected_fragments']],
    ];
    for (const [block, names] of keys) {
      for (const k of names) {
        const want = (summary[block] as Record<string, number>)[k];
        const row = new RegExp(`<tr data-key="${block}\\.${k}"><th scope="row">[^<]*</th><td class="num">([^<]*)</td>`).exec(html);
        expect(row, `${block}.${k}`).not.toBeNull();
        const shown = Number(row![1]);
        expect(Number.isFinite(shown), `${block}.${k} = ${row![1]}`).toBe(true);
        // 3 significant figures: relative rounding error at most 0.5e-2; integers exact
        if (Number.isInteger(want)) expect(shown).toBe(want);
        else expect(Math.abs(shown - want) / Math.abs(want)).toBeLessThanOrEqual(0.005);
      }
    }
    // a null value reads n/a
    expect(html).toMatch(/<tr data-key="hierarchy\.cmf_slope"><th scope="row">[^<]*<\/th><td class="num">n\/a<\/td>/);
  });

  it('shows the verdict with its reason, the warnings escaped and the cautions', () => {
    expect(html).toContain('<span class="status">not resolved</span>');
    expect(html).toContain(String(summary.resolution?.verdict_reason));
    expect(html).toContain('grid under-resolves the densest gas &lt;by design of this fixture&gt; &amp; more');
    expect(html).toMatch(/not a simulation/i);
    expect(html).toMatch(/convergence in the real run/i);
  });

  it('includes the config text escaped', () => {
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;quotes&quot;');
    expect(html).not.toContain('<script>alert(1)</script>');
  });

  it('marks the Jeans limit at 1/N_J and the input spectral slope', () => {
    // Truelove et al. 1997: J = 1/4
    expect(html).toContain('limit J = 1/4');
    expect(html).toContain('input slope k^-4');
    expect(html).toContain('Salpeter 1955 (slope 2.35)');
  });
});

describe('renderReport edge cases', () => {
  it('an empty run (no fields, no candidates, empty tree, no resolution) still has five SVGs saying why', () => {
    const s = fixtureSummary();
    delete s.resolution;
    delete s.cloud;
    const plots: PlotData = {
      schema: 'fragplan.plots/1', density_pdf: null, velocity_spectrum: null, jeans_histogram: null,
      mass_spectrum: { masses_msun: [], fit: null, models: [] }, tree: [],
    };
    const html = renderReport({ ...s, warnings: [], cautions: [] }, plots, '');
    expect((html.match(/<svg/g) ?? []).length).toBe(5);
    expect(html).toContain('No fragment candidates');
    expect(html).toContain('the tree is empty');
    expect(html).toContain('No resolution verdict');
    expect(html).toMatch(/not a simulation/i);
    expect(html).toContain('<p>None.</p>');
    expect(tagProblems(html)).toEqual([]);
  });

  it('one tree node and one candidate draw without NaN coordinates', () => {
    const plots = fixturePlots();
    plots.tree = [{ id: 0, parent: -1, mass_msun: 3, merge_density_gcc: 1e-19, peak_density_gcc: 1e-19, state: 'stable', candidate: true }];
    plots.mass_spectrum = { masses_msun: [3], fit: { slope: 2.3, slope_error: 0.4, xmin_msun: 3, n_tail: 1 }, models: [] };
    const html = renderReport(fixtureSummary(), plots, '');
    expect(html).not.toContain('NaN');
    expect(html).not.toContain('Infinity');
  });
});
