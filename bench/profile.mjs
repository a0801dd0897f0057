#!/usr/bin/env node
/**
 * Where does `fragplan plan` spend its time? Runs it once under V8's sampling profiler
 * (node --cpu-prof; worker threads write their own profiles) and prints the top functions by
 * self time for the main thread and for the workers together, plus the stage timings of
 * summary.json (timings_s).
 *
 * Usage: node bench/profile.mjs [--cells 256] [--preset presets/massive-clump.yaml] [--top 25]
 *          [--workers N] [--dir DIR (keep the .cpuprofile files there)]
 * Results: printed as Markdown; the aggregated table also goes to bench/results/profile-<date>.json.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const CLI = path.join(ROOT, 'dist', 'cli.js');

function parseArgs(argv) {
  const o = { cells: 256, preset: 'presets/massive-clump.yaml', top: 25, workers: null, dir: null };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const v = argv[++i];
    if (v === undefined) throw new Error(`${a} expects a value`);
    if (a === '--cells') o.cells = Number(v);
    else if (a === '--preset') o.preset = v;
    else if (a === '--top') o.top = Number(v);
    else if (a === '--workers') o.workers = Number(v);
    else if (a === '--dir') o.dir = v;
    else throw new Error(`unknown option ${a}`);
  }
  return o;
}

const SPECIAL = new Set(['(idle)', '(program)', '(garbage collector)', '(root)']);

const fileLines = new Map();
/** The src/ file a bundled dist/ line came from: esbuild puts a `// src/....ts` line before each module. */
function sourceOf(file, line) {
  if (!file.startsWith(ROOT) || !existsSync(file)) return null;
  if (!fileLines.has(file)) fileLines.set(file, readFileSync(file, 'utf8').split('\n'));
  const lines = fileLines.get(file);
  for (let i = Math.min(line, lines.length - 1); i >= 0; i--) {
    const m = lines[i].match(/^\/\/ (src\/\S+\.ts)$/);
    if (m) return m[1];
  }
  return null;
}

/** Self time (ms) per function of one .cpuprofile. */
export function selfTimes(profile) {
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const self = new Map();
  const { samples = [], timeDeltas = [] } = profile;
  for (let i = 0; i < samples.length; i++) {
    // sample i stands for the interval until the next sample
    const dt = (timeDeltas[i + 1] ?? 0) / 1000;
    const n = byId.get(samples[i]);
    if (!n) continue;
    const cf = n.callFrame;
    const file = cf.url ? cf.url.replace(/^file:\/\//, '') : '';
    const src = file ? sourceOf(file, cf.lineNumber) : null;
    const where = src ?? (file ? `${file.replace(`${ROOT}/`, '')}:${cf.lineNumber + 1}` : '');
    const key = SPECIAL.has(cf.functionName) ? cf.functionName : `${cf.functionName || '(anonymous)'}${where ? ` (${where})` : ''}`;
    self.set(key, (self.get(key) ?? 0) + dt);
  }
  return { self, totalMs: (profile.endTime - profile.startTime) / 1000 };
}

function merge(into, from) {
  for (const [k, v] of from) into.set(k, (into.get(k) ?? 0) + v);
}

async function main() {
  const o = parseArgs(process.argv.slice(2));
  if (!existsSync(CLI)) throw new Error('dist/cli.js is missing: run `npm run build` first');
  const dir = o.dir ? path.resolve(o.dir) : mkdtempSync(path.join(tmpdir(), 'fragplan-prof-'));
  mkdirSync(dir, { recursive: true });
  const out = path.join(dir, 'run');
  const args = ['--cpu-prof', '--cpu-prof-dir', dir, CLI, 'plan', path.resolve(ROOT, o.preset), '--cells', String(o.cells), '--out', out, '--force', '--quiet', ...(o.workers ? ['--workers', String(o.workers)] : [])];
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, args, { cwd: ROOT, stdio: ['ignore', 'ignore', 'pipe'] });
  const wall = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(`plan failed (exit ${r.status}): ${r.stderr.toString().trim().split('\n').slice(-3).join(' | ')}`);
  const summary = existsSync(path.join(out, 'summary.json')) ? JSON.parse(readFileSync(path.join(out, 'summary.json'), 'utf8')) : {};
  const timings = summary.timings_s ?? {};
  const h = summary.hierarchy ?? {};

  const main = new Map();
  const workers = new Map();
  let mainMs = 0;
  let workerMs = 0;
  let nWorkers = 0;
  for (const f of readdirSync(dir).filter((f) => f.endsWith('.cpuprofile'))) {
    // CPU.<date>.<time>.<pid>.<thread id>.<seq>.cpuprofile; thread id 0 is the main thread
    const tid = Number(f.split('.')[4]);
    const { self, totalMs } = selfTimes(JSON.parse(readFileSync(path.join(dir, f), 'utf8')));
    if (tid === 0) { merge(main, self); mainMs += totalMs; } else { merge(workers, self); workerMs += totalMs; nWorkers++; }
  }
  const L = [`### Profile of \`fragplan plan ${o.preset} --cells ${o.cells}\` (wall ${wall.toFixed(2)} s under the profiler)`, ''];
  if (Object.keys(timings).length) {
    L.push('Stage timings (summary.json timings_s, s): ' + Object.entries(timings).map(([k, v]) => `${k} ${Number(v).toFixed(2)}`).join(', '), '');
  }
  if (h.nodes !== undefined) L.push(`Tree: ${h.nodes} nodes, max depth ${h.max_depth ?? '?'}, ${h.fragment_candidates ?? '?'} fragment candidates`, '');
  const table = (title, m, totalMs) => {
    const busy = [...m].filter(([k]) => !SPECIAL.has(k) || k === '(garbage collector)').reduce((s, [, v]) => s + v, 0);
    L.push(`${title}: profiled ${(totalMs / 1000).toFixed(2)} s, busy ${(busy / 1000).toFixed(2)} s, idle ${(((m.get('(idle)') ?? 0)) / 1000).toFixed(2)} s`, '');
    L.push('| self s | % of busy | function (source file) |', '| ---: | ---: | --- |');
    for (const [k, v] of [...m].filter(([k]) => k !== '(idle)').sort((a, b) => b[1] - a[1]).slice(0, o.top)) {
      L.push(`| ${(v / 1000).toFixed(2)} | ${((100 * v) / busy).toFixed(1)} | ${k.replace(/\|/g, '\\|')} |`);
    }
    L.push('');
  };
  table('Main thread', main, mainMs);
  if (nWorkers) table(`Worker threads (${nWorkers} together)`, workers, workerMs);
  process.stdout.write(L.join('\n'));
  const resultsDir = path.join(ROOT, 'bench', 'results');
  mkdirSync(resultsDir, { recursive: true });
  const date = new Date().toISOString().replace(/[:.]/g, '-');
  const sorted = (m) => [...m].sort((a, b) => b[1] - a[1]).map(([k, v]) => ({ fn: k, self_ms: +v.toFixed(1) }));
  writeFileSync(path.join(resultsDir, `profile-${date}.json`), JSON.stringify({ cells: o.cells, preset: o.preset, wall_s: wall, timings_s: timings, hierarchy: h, main: sorted(main), workers: sorted(workers), worker_threads: nWorkers }, null, 1) + '\n');
  if (!o.dir) rmSync(dir, { recursive: true, force: true });
  else rmSync(out, { recursive: true, force: true });
}

main().catch((e) => {
  process.stderr.write(`profile: ${e.message ?? e}\n`);
  process.exit(1);
});
