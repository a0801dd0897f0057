/**
 * Runs reference scripts in Debian's system python3 (/usr/bin/python3), where .ci/run installs
 * python3-numpy, python3-scipy and python3-h5py. These are the outside references of the tests.
 */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';

/** Path of the python3 that has numpy, scipy and h5py. */
export const PYTHON = existsSync('/usr/bin/python3') ? '/usr/bin/python3' : 'python3';

/** Runs a python script with stdin text and returns stdout parsed as JSON. */
export function pythonJson<T = unknown>(script: string, input = ''): T {
  const out = execFileSync(PYTHON, ['-c', script], { input, maxBuffer: 1 << 30 }).toString();
  return JSON.parse(out) as T;
}
