/**
 * The fragplan commands (commander program): parse options, call one pipeline function, print.
 * Results go to stdout (JSON with --json), progress and messages to stderr.
 * Exit codes: 0 success, 1 failure, 2 bad input. Entry: src/cli.ts.
 */
import { Command, InvalidArgumentError } from 'commander';
import { runCommand } from './run-command.js';
import { terminalProgress } from './progress-bars.js';
import { listPresets, writePreset } from '../pipeline/presets.js';
import { loadConfig } from '../config/load.js';
import { parseQuantity, UnitError, type DimensionName } from '../physics/units.js';
import { TOOL_VERSION } from '../version.js';
import type { PlanPools } from '../pipeline/plan-pools.js';
import type { Summary } from '../report/summary-types.js';
import { jsonText } from '../report/build-summary.js';

/** Threads the entry started for `plan` before this module loaded (see src/cli.ts), or null. */
let earlyPools: PlanPools | null = null;

/** Parses a positive integer option value. */
function positiveInt(name: string) {
  return (v: string): number => {
    const n = Number(v);
    if (!Number.isInteger(n) || n < 1) throw new InvalidArgumentError(`${name} expects a positive integer, got "${v}"`);
    return n;
  };
}

/** Parses a non-negative integer option value (seeds). */
function seedValue(v: string): number {
  const n = Number(v);
  if (!Number.isInteger(n) || n < 0 || n > 2 ** 31 - 1) throw new InvalidArgumentError(`--seed expects an integer from 0 to 2147483647, got "${v}"`);
  return n;
}

/** Parses a quantity option ("2 pc") to cgs. */
function quantityOption(name: string, dim: DimensionName, unit: string) {
  return (v: string): number => {
    try {
      const x = parseQuantity(v, dim, unit);
      if (!(x > 0)) throw new UnitError(`expected a positive value, got "${v}"`);
      return x;
    } catch (e) {
      throw new InvalidArgumentError(`${name}: ${(e as Error).message}`);
    }
  };
}

function print(text: string): void {
  process.stdout.write(text.endsWith('\n') ? text : `${text}\n`);
}

function printJson(value: unknown): void {
  print(jsonText(value));
}

/** Prints a plan's or survey's result: summary.json with --json, else the terminal summary and (unless quiet) the files written. */
async function printRun(r: { summary: Summary; runDir: string; files: string[] }, opts: { json?: boolean; quiet?: boolean }): Promise<void> {
  if (opts.json) return printJson(r.summary);
  const { terminalSummary } = await import('../report/terminal-summary.js');
  print(terminalSummary(r.summary));
  if (!opts.quiet) process.stderr.write(`wrote ${r.runDir}/ (${r.files.join(', ')})\n`);
}

interface CommonOpts { out?: string; cells?: number; seed?: number; json?: boolean; force?: boolean; quiet?: boolean }

const program = new Command();
program
  .name('fragplan')
  .description('Plan star-formation simulations: clouds, Jeans-unstable hierarchy, resolution and cost, initial conditions.')
  .version(TOOL_VERSION)
  .configureOutput({ outputError: (str, write) => write(`fragplan: ${str.replace(/^error: /, '').trim()}\n`) })
  .exitOverride((err) => {
    if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') process.exit(0);
    process.exit(2);
  });

program
  .command('plan <config>')
  .description('generate the cloud, survey it, budget resolution and cost, write every output')
  .option('--out <dir>', 'run folder (default runs/<config name>)')
  .option('--cells <n>', 'cells per side (power of two)', positiveInt('--cells'))
  .option('--seed <n>', 'random seed', seedValue)
  .option('--workers <n>', 'worker threads', positiveInt('--workers'))
  .option('--realizations <k>', 'repeat over k seeds and report the spread', positiveInt('--realizations'))
  .option('--json', 'print summary.json on stdout')
  .option('--force', 'replace the files of an existing run')
  .option('--quiet', 'no progress bars or messages')
  .action(runCommand(async (file: string, opts: CommonOpts & { workers?: number; realizations?: number }) => {
    // the worker threads (started by the entry already, for the same count): they boot while the pipeline and the config load
    const { planPools, closePlanPools } = await import('../pipeline/plan-pools.js');
    const { defaultWorkerCount } = await import('../grid/pool.js');
    const pools = await planPools(opts.workers ?? defaultWorkerCount(), earlyPools ?? undefined);
    earlyPools = null;
    let loaded;
    try {
      loaded = loadConfig(file);
    } catch (e) {
      await closePlanPools(pools);
      throw e;
    }
    const { runPlan } = await import('../pipeline/plan.js');
    const r = await runPlan(loaded, { ...opts, force: !!opts.force, progress: terminalProgress(!!opts.quiet || !!opts.json), pools });
    await printRun(r, opts);
  }));

program
  .command('budget <config>')
  .description('resolution and cost plan only: analytic, no grid')
  .option('--cells <n>', 'base cells per side of the target run', positiveInt('--cells'))
  .option('--seed <n>', 'random seed (with --ladder)', seedValue)
  .option('--ladder', 'generate and survey the same cloud at three resolutions and judge convergence')
  .option('--json', 'print the budget as JSON on stdout')
  .option('--quiet', 'no progress bars or messages')
  .action(runCommand(async (file: string, opts: CommonOpts & { ladder?: boolean }) => {
    const loaded = loadConfig(file);
    const { runBudget } = await import('../pipeline/budget.js');
    const b = runBudget(loaded, { cells: opts.cells });
    if (!opts.ladder) return opts.json ? printJson(b.summary) : print(b.text);
    const { runLadderCommand } = await import('../pipeline/ladder-command.js');
    const l = await runLadderCommand(loaded, { cells: opts.cells, seed: opts.seed, progress: terminalProgress(!!opts.quiet || !!opts.json) });
    if (opts.json) return printJson({ ...b.summary, ladder: l.summary });
    print(`${b.text}\n${l.text}`);
  }));

program
  .command('survey <cube>')
  .description('hierarchy and Jeans analysis of an existing density cube (.npy, raw, or a run folder)')
  .option('--box-size <length>', 'box side, e.g. "2 pc" (bare numbers in pc)', quantityOption('--box-size', 'length', 'pc'))
  .option('--temperature <T>', 'gas temperature, e.g. "10 K"', quantityOption('--temperature', 'temperature', 'K'))
  .option('--mu <mu>', 'mean molecular weight per free particle (default 2.33)', Number)
  .option('--shape <nx,ny,nz>', 'shape of a raw cube')
  .option('--dtype <type>', 'dtype of a raw cube: float32 or float64')
  .option('--velocity <vx,vy,vz>', 'three velocity cubes in cm/s (same shape)')
  .option('--density-unit <unit>', 'unit of the cube values (default g cm^-3; cm^-3 means n(H2))', 'g cm^-3')
  .option('--config <file>', 'take the survey settings from this config file')
  .option('--out <dir>', 'output folder (default runs/<cube name>-survey)')
  .option('--json', 'print the summary on stdout')
  .option('--force', 'replace existing outputs')
  .option('--quiet', 'no progress bars or messages')
  .action(runCommand(async (cube: string, opts: CommonOpts & Record<string, string | number | boolean | undefined>) => {
    const { runSurvey } = await import('../pipeline/survey.js');
    const r = await runSurvey(cube, {
      boxSize: opts.boxSize as number | undefined, temperature: opts.temperature as number | undefined, mu: opts.mu as number | undefined,
      shape: opts.shape as string | undefined, dtype: opts.dtype as string | undefined, velocity: opts.velocity as string | undefined,
      densityUnit: String(opts.densityUnit), configFile: opts.config as string | undefined,
      out: opts.out, force: !!opts.force, progress: terminalProgress(!!opts.quiet || !!opts.json),
    });
    await printRun(r, opts);
  }));

program
  .command('export <rundir>')
  .description('initial conditions for external codes from a plan run')
  .option('--format <list>', 'comma list of npy, hdf5, raw, vti', 'npy')
  .option('--particles <n>', 'also sample this many equal-mass particles', positiveInt('--particles'))
  .option('--method <m>', 'particle sampling: lattice (low noise) or monte-carlo', 'lattice')
  .option('--units <system>', 'cgs, si or code (G = 1)', 'cgs')
  .option('--precision <p>', 'float32 or float64', 'float32')
  .option('--json', 'print what was written as JSON')
  .option('--force', 'replace existing files')
  .option('--quiet', 'no progress bars or messages')
  .action(runCommand(async (dir: string, opts: CommonOpts & { format: string; particles?: number; method: string; units: string; precision: string }) => {
    const { runExport } = await import('../pipeline/export.js');
    const formats = opts.format.split(',').map((s) => s.trim()).filter(Boolean);
    const r = await runExport(dir, { formats, particles: opts.particles, method: opts.method, units: opts.units as 'cgs', precision: opts.precision, force: !!opts.force }, terminalProgress(!!opts.quiet || !!opts.json));
    if (opts.json) return printJson(r);
    print(JSON.stringify(r, null, 2));
  }));

program
  .command('view <target>')
  .description('serve the viewer for a run folder or preview.zip on 127.0.0.1')
  .option('--port <n>', 'port (default: a free one)', positiveInt('--port'))
  .action(runCommand(async (target: string, opts: { port?: number }) => {
    const { startViewServer } = await import('../pipeline/view.js');
    const server = await startViewServer(target, { port: opts.port });
    print(server.url);
    process.stderr.write('serving on loopback only; press Ctrl-C to stop\n');
    await new Promise<void>((resolve) => {
      const stop = (): void => { void server.close().then(resolve); };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    });
  }));

program
  .command('presets')
  .description('list the shipped scenario configs')
  .option('--json', 'machine-readable list on stdout')
  .action(runCommand((opts: { json?: boolean }) => {
    const ps = listPresets();
    if (opts.json) printJson(ps.map(({ name, description }) => ({ name, description })));
    else for (const p of ps) print(`${p.name.padEnd(24)} ${p.description}`);
  }));

program
  .command('new <preset> <file>')
  .description('write a preset as a starting config')
  .option('--force', 'replace an existing file')
  .action(runCommand((preset: string, file: string, opts: { force?: boolean }) => {
    writePreset(preset, file, !!opts.force);
    process.stderr.write(`wrote ${file} from preset ${preset}\n`);
  }));

/** Runs the program on process.argv; `early`: plan threads the entry started (used by plan when their count matches; otherwise stopped). */
export async function runCli(early: PlanPools | null): Promise<void> {
  earlyPools = early;
  try {
    await program.parseAsync(process.argv);
  } finally {
    // another command than plan ran: the early threads are not needed
    if (earlyPools) {
      const { closePlanPools } = await import('../pipeline/plan-pools.js');
      await closePlanPools(earlyPools);
      earlyPools = null;
    }
  }
}
