/**
 * The plain-text summary `fragplan plan` prints: the same key numbers as report.html
 * (keyNumbers), the verdict, warnings and cautions. No colours, no clocks.
 */
import type { Summary } from './summary-types.js';
import { keyNumbers, verdictOf } from './key-numbers.js';

/** The terminal summary of a run as lines of plain text (ends with a newline). */
export function terminalSummary(summary: Summary): string {
  const lines: string[] = [];
  lines.push(`fragplan ${summary.tool_version}: ${summary.name}${summary.seed === null ? '' : ` (seed ${summary.seed})`}`);
  const verdict = verdictOf(summary);
  if (verdict) lines.push(`Verdict: ${verdict.status}${verdict.reason ? ` - ${verdict.reason}` : ''}`);
  const rows = keyNumbers(summary);
  const width = Math.max(0, ...rows.map((r) => r.label.length));
  let group = '';
  for (const r of rows) {
    if (r.group !== group) {
      group = r.group;
      lines.push('', `${group}`);
    }
    lines.push(`  ${r.label.padEnd(width)}  ${r.value}${r.unit ? ` ${r.unit}` : ''}`);
  }
  if (summary.warnings.length > 0) {
    lines.push('', 'Warnings');
    for (const w of summary.warnings) lines.push(`  - ${w}`);
  }
  if (summary.cautions.length > 0) {
    lines.push('', 'Cautions');
    for (const c of summary.cautions) lines.push(`  - ${c}`);
  }
  return lines.join('\n') + '\n';
}
