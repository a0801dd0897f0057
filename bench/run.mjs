#!/usr/bin/env node
/**
 * Side-by-side benchmark: `fragplan plan` against bench/reference_plan.py (numpy/scipy) on the
 * same preset, both timed as whole processes, alternating, several runs each; plus
 * `fragplan budget` as a whole process.
 *
 * Usage: npm run bench -- [--cells 64,128,256] [--runs 3] [--preset presets/massive-clump.yaml]
 *          [--only fragplan|script] [--budget-runs 5] [--workers N] [--python /usr/bin/python3]
 *          [--tmp DIR] [--keep]
 * Needs a built dist/ (npm run build). Peak memory comes from GNU time's verbose mode
 * (/usr/bin/time -v, "Maximum resident set size"). Raw results go to bench/results/<date>.json;
 * the tables are printed as Markdown. Wall time is measured here around each process.
 */
import { spawn, execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, freemem, loadavg, tmpdir, totalmem } from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { scriptArgsFromConfig, DEFAULT_SCRIPT_PARAMS } from './script-params.mjs';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const CLI = path.join(ROOT, 'dist', 'cli.js');
const SCRIPT = path.join(ROOT, 'bench', 'reference_plan.py');
const GNU_TIME = '/usr/bin/time';

function parseArgs(argv) {
  const o = { cells: [64, 128, 256], runs: 3, preset: 'presets/massive-clump.yaml', only: null, budgetRuns: 5, workers: null, python: '/usr/bin/python3', tmp: null, keep: false };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const val = () => {
      const v = argv[++i];
      if (v === undefined) fail(`${a} expects a value`);
      return v;
    };
    if (a === '--cells') o.cells = val().split(',').map((s) => positiveInt(a, s));
    else if (a === '--runs') o.runs = positiveInt(a, val());
    else if (a === '--preset') o.preset = val();
    else if (a === '--only') {
      o.only = val();
      if (!['fragplan', 'script'].includes(o.only)) fail('--only expects fragplan or script');
    } else if (a === '--budget-runs') o.budgetRuns = Number(val());
    else if (a === '--workers') o.workers = positiveInt(a, val());
    else if (a === '--python') o.python = val();
    else if (a === '--tmp') o.tmp = val();
    else if (a === '--keep') o.keep = true;
    else if (a === '--help' || a === '-h') {
      process.stdout.write(readFileSync(fileURLToPath(import.meta.url), 'utf8').split('\n').slice(2, 12).join('\n') + '\n');
      process.exit(0);
    } else fail(`unknown option ${a}`);
  }
  return o;
}

function fail(msg) {
  process.stderr.write(`bench: ${msg}\n`);
  process.exit(2);
}

function positiveInt(name, s) {
  const n = Number(s);
  if (!Number.isInteger(n) || n < 1) fail(`${name} expects positive integers, got "${s}"`);
  return n;
}

const median = (xs) => {
  const s = xs.filter((x) => Number.isFinite(x)).sort((a, b) => a - b);
  if (s.length === 0) return null;
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

/** Parses GNU time -v output into numbers. */
function parseGnuTime(text) {
  const grab = (label) => {
    const m = text.match(new RegExp(`${label}:\\s*([^\\n]+)`));
    return m ? m[1].trim() : null;
  };
  const rss = grab('Maximum resident set size \\(kbytes\\)');
  const user = grab('User time \\(seconds\\)');
  const sys = grab('System time \\(seconds\\)');
  return { peak_rss_kib: rss === null ? null : Number(rss), user_s: user === null ? null : Number(user), sys_s: sys === null ? null : Number(sys) };
}

/** Runs one command as a whole process under GNU time; resolves with wall time, exit code, peak memory. */
function timedRun(cmd, args, { env = process.env, cwd = ROOT } = {}) {
  return new Promise((resolve) => {
    const useTime = existsSync(GNU_TIME);
    const report = path.join(tmpdir(), `fragplan-bench-time-${process.pid}-${Math.random().toString(36).slice(2)}.txt`);
    const [c, a] = useTime ? [GNU_TIME, ['-v', '-o', report, cmd, ...args]] : [cmd, args];
    const t0 = process.hrtime.bigint();
    const child = spawn(c, a, { env, cwd, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => { stdout += d; });
    child.stderr.on('data', (d) => { stderr += d; });
    child.on('close', (code) => {
      const wall = Number(process.hrtime.bigint() - t0) / 1e9;
      let mem = { peak_rss_kib: null, user_s: null, sys_s: null };
      if (useTime && existsSync(report)) {
        mem = parseGnuTime(readFileSync(report, 'utf8'));
        rmSync(report, { force: true });
      }
      resolve({ wall_s: wall, rc: code, ...mem, stdout, stderr: stderr.slice(-2000) });
    });
  });
}

/** Environment for the python runs: OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE removed together if set. */
function pythonEnv() {
  const env = { ...process.env };
  const unset = ['OPENBLAS_CORETYPE', 'OPENBLAS_L2_SIZE'].filter((k) => k in env);
  for (const k of unset) delete env[k];
  return { env, unset };
}

const BLAS_PROBE = String.raw`
import json, re, ctypes, numpy, scipy
info = {'numpy': numpy.__version__, 'scipy': scipy.__version__}
numpy.dot(numpy.ones((8, 8)), numpy.ones((8, 8)))
try:
    from threadpoolctl import threadpool_info
    info['via'] = 'threadpoolctl'
    info['blas'] = [{k: d.get(k) for k in ('internal_api', 'version', 'architecture', 'num_threads', 'filepath')} for d in threadpool_info()]
except ImportError:
    info['via'] = 'ctypes (threadpoolctl not installed)'
    libs = sorted({m.group(1) for line in open('/proc/self/maps') for m in [re.search(r'(/\S*blas\S*\.so[^\s]*)', line)] if m})
    out = []
    for p in libs:
        d = {'filepath': p}
        try:
            lib = ctypes.CDLL(p)
            for sym, key in (('openblas_get_corename', 'architecture'), ('openblas_get_config', 'version')):
                f = getattr(lib, sym, None)
                if f is not None:
                    f.restype = ctypes.c_char_p
                    d[key] = f().decode()
            f = getattr(lib, 'openblas_get_num_threads', None)
            if f is not None:
                d['num_threads'] = f()
        except OSError as e:
            d['error'] = str(e)
        out.append(d)
    info['blas'] = out
print(json.dumps(info))
`;

function machineInfo(python, env) {
  const cpuinfo = existsSync('/proc/cpuinfo') ? readFileSync('/proc/cpuinfo', 'utf8') : '';
  const model = (cpuinfo.match(/model name\s*:\s*([^\n]+)/) ?? [])[1] ?? cpus()[0]?.model ?? 'unknown';
  let py = null;
  try {
    py = JSON.parse(execFileSync(python, ['-c', BLAS_PROBE], { env }).toString());
  } catch (e) {
    py = { error: String(e.message ?? e).split('\n')[0] };
  }
  return {
    nproc: Number(execFileSync('nproc').toString().trim()),
    cpu_model: model.trim(),
    mem_total_gib: +(totalmem() / 2 ** 30).toFixed(1),
    mem_free_gib_at_start: +(freemem() / 2 ** 30).toFixed(1),
    node: process.version,
    python,
    python_libs: py,
  };
}

const gibOf = (kib) => (kib === null ? null : kib / 2 ** 20);
const fmt = (x, d = 2) => (x === null || x === undefined || !Number.isFinite(x) ? '—' : x.toFixed(d));
const fmtMem = (kib) => (kib === null ? '—' : kib >= 2 ** 20 ? `${(kib / 2 ** 20).toFixed(2)} GiB` : `${(kib / 1024).toFixed(0)} MiB`);

async function main() {
  const o = parseArgs(process.argv.slice(2));
  if (!existsSync(CLI)) fail('dist/cli.js is missing: run `npm run build` first');
  const presetPath = path.resolve(ROOT, o.preset);
  if (!existsSync(presetPath)) fail(`preset not found: ${o.preset}`);

  let params;
  try {
    const lib = await import(pathToFileURL(path.join(ROOT, 'dist', 'index.js')).href);
    params = scriptArgsFromConfig(lib, lib.loadConfig(presetPath).config);
  } catch (e) {
    process.stderr.write(`bench: could not read ${o.preset} through dist/index.js (${String(e.message ?? e).split('\n')[0]}); the script uses its defaults\n`);
    params = { args: [], seed: 1, notes: ['preset not read: script defaults used'], values: DEFAULT_SCRIPT_PARAMS };
  }
  for (const n of params.notes) process.stderr.write(`bench: note: ${n}\n`);

  const { env: pyEnv, unset } = pythonEnv();
  const machine = machineInfo(o.python, pyEnv);
  const base = o.tmp ? path.resolve(o.tmp) : path.join(tmpdir(), `fragplan-bench-${process.pid}`);
  mkdirSync(base, { recursive: true });

  const tools = {
    fragplan: (n, out) => ({ cmd: process.execPath, args: [CLI, 'plan', presetPath, '--cells', String(n), '--out', out, '--force', '--quiet', ...(o.workers ? ['--workers', String(o.workers)] : [])], env: process.env }),
    script: (n, out) => ({ cmd: o.python, args: [SCRIPT, '--cells', String(n), '--out', out, '--seed', String(params.seed), ...params.args], env: pyEnv }),
  };
  const names = o.only ? [o.only] : ['fragplan', 'script'];
  const runs = [];
  const load = [];

  for (const n of o.cells) {
    load.push({ cells: n, when: 'before', loadavg: loadavg().map((x) => +x.toFixed(2)) });
    for (let r = 0; r < o.runs; r++) {
      const order = r % 2 === 0 ? names : [...names].reverse(); // alternate which tool goes first
      for (const tool of order) {
        const out = path.join(base, `${tool}-${n}`);
        rmSync(out, { recursive: true, force: true });
        const { cmd, args, env } = tools[tool](n, out);
        process.stderr.write(`bench: ${tool} ${n}^3 run ${r + 1}/${o.runs} ... `);
        const res = await timedRun(cmd, args, { env });
        let timings = null;
        try {
          const sumFile = path.join(out, 'summary.json');
          if (existsSync(sumFile)) timings = JSON.parse(readFileSync(sumFile, 'utf8')).timings_s ?? null;
        } catch { /* timings stay null */ }
        const rec = { tool, cells: n, run: r + 1, wall_s: res.wall_s, rc: res.rc, peak_rss_kib: res.peak_rss_kib, user_s: res.user_s, sys_s: res.sys_s, timings_s: timings };
        if (res.rc !== 0) rec.stderr_tail = res.stderr;
        runs.push(rec);
        process.stderr.write(res.rc === 0 ? `${res.wall_s.toFixed(2)} s, ${fmtMem(res.peak_rss_kib)}\n` : `FAILED (exit ${res.rc}): ${res.stderr.trim().split('\n').slice(-1)[0] ?? ''}\n`);
        if (!o.keep) rmSync(out, { recursive: true, force: true });
      }
    }
    load.push({ cells: n, when: 'after', loadavg: loadavg().map((x) => +x.toFixed(2)) });
  }

  // fragplan budget, as a whole process
  let budget = null;
  if (o.only !== 'script' && o.budgetRuns > 0) {
    const walls = [];
    let peak = null;
    let rc = 0;
    let tail = '';
    for (let r = 0; r < o.budgetRuns; r++) {
      const res = await timedRun(process.execPath, [CLI, 'budget', presetPath, '--quiet']);
      if (res.rc !== 0) { rc = res.rc; tail = res.stderr; break; }
      walls.push(res.wall_s);
      peak = Math.max(peak ?? 0, res.peak_rss_kib ?? 0);
    }
    budget = { runs: walls, median_s: median(walls), peak_rss_kib: peak, rc, ...(rc ? { stderr_tail: tail } : {}) };
  }
  if (!o.keep) rmSync(base, { recursive: true, force: true });

  // summary rows
  const rows = o.cells.map((n) => {
    const pick = (tool) => runs.filter((x) => x.tool === tool && x.cells === n && x.rc === 0);
    const stat = (tool) => {
      const ok = pick(tool);
      const failed = runs.filter((x) => x.tool === tool && x.cells === n && x.rc !== 0).length;
      const wall = median(ok.map((x) => x.wall_s));
      const cpu = median(ok.map((x) => (x.user_s ?? NaN) + (x.sys_s ?? NaN)));
      const peak = ok.length ? Math.max(...ok.map((x) => x.peak_rss_kib ?? 0)) : null;
      const stages = {};
      for (const x of ok) for (const [k, v] of Object.entries(x.timings_s ?? {})) (stages[k] ??= []).push(v);
      return {
        runs_ok: ok.length, runs_failed: failed, median_s: wall, cpu_s: cpu, peak_rss_kib: peak,
        ns_per_cell: wall === null ? null : (wall / n ** 3) * 1e9,
        stage_medians_s: Object.fromEntries(Object.entries(stages).map(([k, v]) => [k, median(v)])),
      };
    };
    const f = names.includes('fragplan') ? stat('fragplan') : null;
    const s = names.includes('script') ? stat('script') : null;
    const ratio = f?.median_s && s?.median_s ? f.median_s / s.median_s : null;
    return { cells: n, fragplan: f, script: s, ratio };
  });

  const results = {
    date: new Date().toISOString(),
    preset: o.preset,
    script_params: params.values,
    script_args: params.args,
    seed: params.seed,
    python_env_unset: unset,
    machine,
    load,
    options: { cells: o.cells, runs: o.runs, workers: o.workers, only: o.only },
    runs,
    summary: rows,
    budget,
  };
  const resultsDir = path.join(ROOT, 'bench', 'results');
  mkdirSync(resultsDir, { recursive: true });
  const file = path.join(resultsDir, `${results.date.replace(/[:.]/g, '-')}.json`);
  writeFileSync(file, JSON.stringify(results, null, 1) + '\n');

  // Markdown
  const L = [];
  L.push(`### fragplan plan vs numpy/scipy script (${o.preset}, medians of ${o.runs} runs)`);
  L.push('');
  L.push('| cells | fragplan (s) | script (s) | ratio fragplan/script | fragplan peak RSS | script peak RSS | fragplan ns/cell | script ns/cell | fragplan CPU/wall | script CPU/wall |');
  L.push('| ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |');
  for (const r of rows) {
    const f = r.fragplan ?? {};
    const s = r.script ?? {};
    const util = (x) => (x.cpu_s && x.median_s ? fmt(x.cpu_s / x.median_s, 2) : '—');
    const failNote = (x) => (x.runs_failed ? ` (${x.runs_failed} failed)` : '');
    L.push(`| ${r.cells}^3 | ${fmt(f.median_s)}${failNote(f)} | ${fmt(s.median_s)}${failNote(s)} | ${fmt(r.ratio)} | ${fmtMem(f.peak_rss_kib ?? null)} | ${fmtMem(s.peak_rss_kib ?? null)} | ${fmt(f.ns_per_cell, 0)} | ${fmt(s.ns_per_cell, 0)} | ${util(f)} | ${util(s)} |`);
  }
  if (budget) {
    L.push('');
    L.push(budget.rc === 0
      ? `\`fragplan budget\`: median ${fmt(budget.median_s, 3)} s over ${budget.runs.length} runs, peak RSS ${fmtMem(budget.peak_rss_kib)} (target < 0.5 s: ${budget.median_s < 0.5 ? 'met' : 'NOT met'})`
      : `\`fragplan budget\`: failed (exit ${budget.rc})`);
  }
  const stageTable = (tool) => {
    const keys = [...new Set(rows.flatMap((r) => Object.keys(r[tool]?.stage_medians_s ?? {})))];
    if (keys.length === 0) return;
    L.push('');
    L.push(`${tool} stage medians (s, from its summary.json timings_s):`);
    L.push('');
    L.push(`| cells | ${keys.join(' | ')} |`);
    L.push(`| ---: | ${keys.map(() => '---:').join(' | ')} |`);
    for (const r of rows) L.push(`| ${r.cells}^3 | ${keys.map((k) => fmt(r[tool]?.stage_medians_s?.[k] ?? null)).join(' | ')} |`);
  };
  stageTable('fragplan');
  stageTable('script');
  L.push('');
  const t256 = rows.find((r) => r.cells === 256);
  if (t256?.ratio) L.push(`- 256^3 ratio ${fmt(t256.ratio)} (target <= 0.5: ${t256.ratio <= 0.5 ? 'met' : 'NOT met'})`);
  const t512 = rows.find((r) => r.cells === 512)?.fragplan;
  if (t512?.peak_rss_kib) L.push(`- 512^3 fragplan peak ${fmtMem(t512.peak_rss_kib)} (target <= 16 GiB: ${gibOf(t512.peak_rss_kib) <= 16 ? 'met' : 'NOT met'})`);
  const perCell = rows.filter((r) => r.fragplan?.ns_per_cell).map((r) => r.fragplan.ns_per_cell);
  if (perCell.length > 1) {
    const steps = rows.filter((r) => r.fragplan?.ns_per_cell).map((r, i, a) => (i === 0 ? null : `${a[i - 1].cells}->${r.cells}: x${fmt(r.fragplan.ns_per_cell / a[i - 1].fragplan.ns_per_cell)}`)).filter(Boolean);
    L.push(`- fragplan time per cell from one size to the next: ${steps.join(', ')} (flat = x1.00; N log N alone gives about x1.1-1.2 per doubling; below ~128^3 process start-up dominates)`);
  }
  const blasList = machine.python_libs?.blas?.map((b) => `${b.internal_api ? `${b.internal_api} ` : ''}${b.version ?? ''}${b.architecture ? ` (kernel ${b.architecture})` : ''}`.trim());
  const blas = blasList ? [...new Set(blasList)].join('; ') : '';
  L.push(`- Machine: ${machine.nproc} cores (${machine.cpu_model}), ${machine.mem_total_gib} GiB; Node ${machine.node}; numpy ${machine.python_libs?.numpy ?? '?'}, scipy ${machine.python_libs?.scipy ?? '?'}${blas ? `, BLAS ${blas}` : ''}${unset.length ? ` (unset for the script: ${unset.join(', ')})` : ''}`);
  L.push(`- Load average before/after each size: ${load.map((x) => `${x.cells}^3 ${x.when} ${x.loadavg.join('/')}`).join('; ')}`);
  L.push(`- Raw results: ${path.relative(ROOT, file)}`);
  process.stdout.write(L.join('\n') + '\n');
  if (runs.some((x) => x.rc !== 0) || (budget && budget.rc !== 0)) process.exitCode = 1;
}

main().catch((e) => {
  process.stderr.write(`bench: ${e.stack ?? e}\n`);
  process.exit(1);
});
