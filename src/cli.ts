#!/usr/bin/env node
/**
 * The fragplan command line: parses options, calls one pipeline function, prints.
 * Results go to stdout (JSON with --json), progress and messages to stderr.
 * Exit codes: 0 success, 1 failure, 2 bad input.
 */
import { Command, InvalidArgumentError } from 'commander';
import { runCommand } from './cli/run-command.js';
import { listPresets, writePreset } from './pipeline/presets.js';
import { TOOL_VERSION } from './version.js';

/** Parses a positive integer option value. */
function positiveInt(name: string) {
  return (v: string): number => {
    const n = Number(v);
    if (!Number.isInteger(n) || n < 1) throw new InvalidArgumentError(`${name} expects a positive integer, got "${v}"`);
    return n;
  };
}
void positiveInt;

const program = new Command();
program
  .name('fragplan')
  .description('Plan star-formation simulations: clouds, Jeans-unstable hierarchy, resolution and cost, initial conditions.')
  .version(TOOL_VERSION)
  .showHelpAfterError(false)
  .configureOutput({ outputError: (str, write) => write(`fragplan: ${str.replace(/^error: /, '').trim()}\n`) })
  .exitOverride((err) => {
    if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') process.exit(0);
    process.exit(2);
  });

program
  .command('presets')
  .description('list the shipped scenario configs')
  .option('--json', 'machine-readable list on stdout')
  .action(runCommand((opts: { json?: boolean }) => {
    const ps = listPresets();
    if (opts.json) process.stdout.write(`${JSON.stringify(ps.map(({ name, description }) => ({ name, description })), null, 2)}\n`);
    else for (const p of ps) process.stdout.write(`${p.name.padEnd(24)} ${p.description}\n`);
  }));

program
  .command('new <preset> <file>')
  .description('write a preset as a starting config')
  .option('--force', 'replace an existing file')
  .action(runCommand((preset: string, file: string, opts: { force?: boolean }) => {
    writePreset(preset, file, !!opts.force);
    process.stderr.write(`wrote ${file} from preset ${preset}\n`);
  }));

await program.parseAsync(process.argv);
