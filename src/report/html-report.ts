/**
 * report.html: one self-contained page (inline CSS and SVG, no scripts, no network) with the key
 * numbers and verdict, one SVG per plot, warnings, cautions and the config text.
 */
import type { Summary } from './summary-types.js';
import type { PlotData } from './plot-data.js';
import { escapeHtml } from './html-escape.js';
import { keyNumbers, verdictOf } from './key-numbers.js';
import { densityPdfSvg, jeansHistogramSvg, massSpectrumSvg, velocitySpectrumSvg } from './svg-charts.js';
import { dendrogramSvg } from './svg-dendrogram.js';
import { CAUTIONS } from './build-summary.js';

/** Cautions every report carries, whatever the summary says: the summary's own list (build-summary.ts). */
export const STANDARD_CAUTIONS: readonly string[] = [CAUTIONS[0]!, CAUTIONS[2]!];

const CSS = `
body{font-family:system-ui,-apple-system,"Segoe UI",Helvetica,Arial,sans-serif;margin:0;color:#1d1d1d;background:#fafafa}
main{max-width:1120px;margin:0 auto;padding:16px 24px 48px}
h1{font-size:1.5em;margin:.4em 0 .1em}h2{font-size:1.15em;margin:1.6em 0 .5em;border-bottom:1px solid #ddd;padding-bottom:.2em}
.meta{color:#555;font-size:.9em}
.verdict{border-left:6px solid #5d7a99;background:#fff;padding:.6em 1em;margin:1em 0}
.verdict.resolved{border-color:#2e8b57}.verdict.marginal{border-color:#e08e0b}.verdict.not-resolved{border-color:#c0392b}
.verdict .status{font-weight:bold;text-transform:capitalize}
.cautions{background:#fff8e6;border:1px solid #e8d49a;padding:.5em 1em}
.warnings{background:#fdeeee;border:1px solid #e6b3b3;padding:.5em 1em}
.keys{display:flex;flex-wrap:wrap;gap:16px;align-items:flex-start}
table.numbers{border-collapse:collapse;background:#fff;min-width:320px}
table.numbers caption{text-align:left;font-weight:bold;padding:4px 0}
table.numbers th,table.numbers td{padding:3px 8px;border-bottom:1px solid #eee;text-align:left;font-weight:normal}
table.numbers td.num{text-align:right;font-variant-numeric:tabular-nums}
.plots{display:flex;flex-wrap:wrap;gap:16px}
figure{margin:0}
svg.plot{background:#fff;border:1px solid #ddd;font-size:11px;font-family:inherit;max-width:100%;height:auto}
pre.config{background:#fff;border:1px solid #ddd;padding:.8em;overflow:auto;font-size:.85em}
`;

function numbersTables(summary: Summary): string {
  const rows = keyNumbers(summary);
  const groups: string[] = [];
  for (const r of rows) if (!groups.includes(r.group)) groups.push(r.group);
  return groups
    .map((g) => {
      const body = rows
        .filter((r) => r.group === g)
        .map(
          (r) =>
            `<tr data-key="${escapeHtml(r.key)}"><th scope="row">${escapeHtml(r.label)}</th><td class="num">${escapeHtml(r.value)}</td><td class="unit">${escapeHtml(r.unit)}</td></tr>`,
        )
        .join('\n');
      return `<table class="numbers"><caption>${escapeHtml(g)}</caption><tbody>\n${body}\n</tbody></table>`;
    })
    .join('\n');
}

function list(items: readonly string[]): string {
  return `<ul>${items.map((t) => `<li>${escapeHtml(t)}</li>`).join('')}</ul>`;
}

/** The whole report page for a run: summary.json, plots.json and the config text it was made from. */
export function renderReport(summary: Summary, plots: PlotData, configText: string): string {
  const verdict = verdictOf(summary);
  const cautions = [...summary.cautions];
  // the two cautions every report must carry, unless the summary already says them
  if (!cautions.some((c) => /not a simulation/i.test(c))) cautions.unshift(STANDARD_CAUTIONS[0]);
  if (!cautions.some((c) => /convergence/i.test(c))) cautions.push(STANDARD_CAUTIONS[1]);
  const meta = [
    `fragplan ${summary.tool_version}`,
    summary.seed === null ? 'no seed' : `seed ${summary.seed}`,
    summary.config_sha256 ? `config sha256 ${summary.config_sha256}` : '',
  ].filter(Boolean);
  const verdictHtml = verdict
    ? `<section class="verdict ${escapeHtml(verdict.status.toLowerCase().replace(/[^a-z]+/g, '-'))}" id="verdict"><span class="status">${escapeHtml(verdict.status)}</span>${verdict.reason ? ` &mdash; ${escapeHtml(verdict.reason)}` : ''}</section>`
    : `<section class="verdict" id="verdict"><span class="status">No resolution verdict</span> &mdash; this run has no resolution block.</section>`;
  const plotsHtml = [
    densityPdfSvg(plots.density_pdf),
    velocitySpectrumSvg(plots.velocity_spectrum),
    jeansHistogramSvg(plots.jeans_histogram),
    massSpectrumSvg(plots.mass_spectrum),
    dendrogramSvg(plots.tree),
  ]
    .map((svg) => `<figure>${svg}</figure>`)
    .join('\n');
  const warnings =
    summary.warnings.length > 0
      ? `<section class="warnings" id="warnings"><h2>Warnings</h2>${list(summary.warnings)}</section>`
      : `<section id="warnings"><h2>Warnings</h2><p>None.</p></section>`;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>fragplan report: ${escapeHtml(summary.name)}</title>
<style>${CSS}</style>
</head>
<body>
<main>
<h1>fragplan report: ${escapeHtml(summary.name)}</h1>
<p class="meta">${meta.map(escapeHtml).join(' &middot; ')}</p>
${verdictHtml}
<section class="cautions" id="cautions"><strong>Read this first.</strong>${list(cautions)}</section>
<h2>Key numbers</h2>
<div class="keys">
${numbersTables(summary)}
</div>
<h2>Plots</h2>
<div class="plots">
${plotsHtml}
</div>
${warnings}
<h2>Config</h2>
<pre class="config">${escapeHtml(configText)}</pre>
</main>
</body>
</html>
`;
}
