/**
 * Errors caused by the user's input (config, files, options). The CLI prints the message as
 * one line and exits with code 2; every other error exits with code 1.
 */

/** Bad input: message names the key, file or option and what was expected. */
export class InputError extends Error {
  override name = 'InputError';
}

/** Bad input that is a run that would not fit in memory; carries the estimate in bytes. */
export class MemoryRefusal extends InputError {
  override name = 'MemoryRefusal';
  constructor(message: string, readonly estimateBytes: number) {
    super(message);
  }
}
