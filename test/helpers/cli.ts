/** Runs the built command line (dist/cli.js) as a whole process and captures its output. */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

/** Repository root. */
export const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/** Result of one CLI run. */
export interface CliRun { status: number; stdout: string; stderr: string }

/** Runs `node dist/cli.js ...args` in the repository root. */
export function fragplan(args: string[], env: Record<string, string> = {}): CliRun {
  const r = spawnSync(process.execPath, [`${ROOT}dist/cli.js`, ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, ...env }, maxBuffer: 1 << 28 });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}
