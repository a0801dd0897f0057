/** The run directory: default location and the guard against overwriting an earlier run. */
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { InputError } from '../input-error.js';

/** Default output folder for a config name: runs/<name>. */
export function defaultRunDir(name: string): string {
  return path.join('runs', name);
}

/** Refuses a non-empty existing folder unless force; refuses a path that is a file. */
export function assertRunDirUsable(dir: string, force: boolean): void {
  if (!existsSync(dir)) return;
  if (!statSync(dir).isDirectory()) throw new InputError(`--out ${dir}: exists and is not a folder`);
  if (!force && readdirSync(dir).length > 0) throw new InputError(`--out ${dir}: folder holds an earlier run (use --force to replace its files, or choose another --out)`);
}
