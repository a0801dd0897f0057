/** terminalSummary: plain text with the same key numbers as report.html, the verdict and the cautions. */
import { describe, expect, it } from 'vitest';
import { terminalSummary } from '../src/report/terminal-summary.js';
import { renderReport } from '../src/report/html-report.js';
import { fixturePlots, fixtureSummary } from './helpers/make-preview.js';

/** label -> value pairs of the report's key-number tables. */
function htmlPairs(html: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const m of html.matchAll(/<tr data-key="[^"]+"><th scope="row">([^<]*)<\/th><td class="num">([^<]*)<\/td><td class="unit">([^<]*)<\/td><\/tr>/g)) {
    out.set(m[1].replace(/&amp;/g, '&'), `${m[2]} ${m[3]}`.trim());
  }
  return out;
}

describe('terminalSummary', () => {
  const s = fixtureSummary();
  const text = terminalSummary(s);

  it('shows exactly the key numbers the HTML report shows (same labels, values, units)', () => {
    const pairs = htmlPairs(renderReport(s, fixturePlots(), ''));
    expect(pairs.size).toBeGreaterThan(20);
    const lines = text.split('\n');
    for (const [label, value] of pairs) {
      const line = lines.find((l) => l.trimStart().startsWith(label + ' '));
      expect(line, label).toBeDefined();
      expect(line!.slice(line!.indexOf(label) + label.length).trim()).toBe(value);
    }
    // and no key-number line the report lacks: indented "label  value" lines count the same
    const numberLines = lines.filter((l) => /^ {2}\S.*\s{2,}\S/.test(l));
    expect(numberLines.length).toBe(pairs.size);
  });

  it('states the verdict, the warnings and the cautions, in plain text', () => {
    expect(text).toContain(`Verdict: not resolved - ${String(s.resolution?.verdict_reason)}`);
    expect(text).toContain(s.warnings[0]);
    expect(text).toContain(s.cautions[0]);
    expect(text).not.toMatch(/\x1b\[/); // no terminal colour codes
    expect(text.endsWith('\n')).toBe(true);
  });

  it('an empty summary still prints its title', () => {
    const bare = { ...s, warnings: [], cautions: [], hierarchy: {}, cost: undefined, resolution: undefined, cloud: undefined };
    const t = terminalSummary(bare);
    expect(t.split('\n')[0]).toBe('fragplan 0.1.0: two-blobs (seed 7)');
    expect(t).not.toContain('Verdict');
  });
});
