// Golden checksums of a 32^3 plan, recorded on 2026-12-02 BEFORE the performance work of the
// "performance and scale" issue (test/data/golden-32.json). Optimisations must not change a byte.
// Re-recorded once on 2026-12-02 for a bug fix, not a speed change: the grid Jeans numbers applied the
// barotropic EOS to a temperature field that already held it (only summary.json changed).
// To re-record deliberately (a change of results, not of speed): FRAGPLAN_RECORD_GOLDEN=1 npx vitest run test/golden.test.ts
import { describe, it, expect } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { fragplan, ROOT } from './helpers/cli.js';

const GOLDEN = path.join(ROOT, 'test', 'data', 'golden-32.json');

function sha(file: string): string {
  let data: Buffer | string = readFileSync(file);
  if (file.endsWith('summary.json')) {
    const s = JSON.parse(data.toString());
    delete s.timings_s;
    delete s.tool_version;
    data = JSON.stringify(s);
  }
  return createHash('sha256').update(data).digest('hex');
}

/** Checksums of every output of a 32^3 plan (seed 11) run with the given extra options. */
function planChecksums(extra: string[]): Record<string, string> {
  const out = path.join(mkdtempSync(path.join(tmpdir(), 'fragplan-golden-')), 'run');
  const r = fragplan(['plan', 'presets/massive-clump.yaml', '--cells', '32', '--seed', '11', '--out', out, '--quiet', ...extra]);
  expect(r.status).toBe(0);
  const files = ['summary.json', 'tree.json', 'fragments.csv', ...readdirSync(path.join(out, 'ic')).filter((f) => f.endsWith('.npy')).map((f) => `ic/${f}`)].sort();
  return Object.fromEntries(files.map((f) => [f, sha(path.join(out, f))]));
}

describe('golden 32^3 plan', () => {
  it('gives the recorded bytes for every output', () => {
    const got = planChecksums([]);
    if (process.env.FRAGPLAN_RECORD_GOLDEN === '1') writeFileSync(GOLDEN, `${JSON.stringify(got, null, 2)}\n`);
    const want = JSON.parse(readFileSync(GOLDEN, 'utf8')) as Record<string, string>;
    expect(got).toEqual(want);
  });

  it('gives the same bytes on one thread (no pool, tree built inline) as with workers and the tree on its own worker', () => {
    const want = JSON.parse(readFileSync(GOLDEN, 'utf8')) as Record<string, string>;
    expect(planChecksums(['--workers', '1'])).toEqual(want);
    expect(planChecksums(['--workers', '3'])).toEqual(want);
  });
});
