/**
 * Wraps a command's action: bad input exits 2 with one line, other failures exit 1 with one
 * line (a stack trace only with FRAGPLAN_DEBUG=1), success exits 0.
 */
import { InputError } from '../input-error.js';
import { UnitError } from '../physics/units.js';

/** Exit code for bad input (config, file, option). */
export const EXIT_BAD_INPUT = 2;
/** Exit code for any other failure. */
export const EXIT_FAILURE = 1;

/** Runs an async action, mapping errors to exit codes and one-line messages on stderr. */
export function runCommand<A extends unknown[]>(action: (...args: A) => Promise<void> | void): (...args: A) => Promise<void> {
  return async (...args: A) => {
    try {
      await action(...args);
    } catch (e) {
      const bad = e instanceof InputError || e instanceof UnitError || e instanceof RangeError;
      const msg = e instanceof Error ? e.message : String(e);
      process.stderr.write(`fragplan: ${bad ? '' : 'error: '}${msg.split('\n')[0]}\n`);
      if (process.env.FRAGPLAN_DEBUG === '1' && e instanceof Error && e.stack) process.stderr.write(`${e.stack}\n`);
      process.exitCode = bad ? EXIT_BAD_INPUT : EXIT_FAILURE;
    }
  };
}
