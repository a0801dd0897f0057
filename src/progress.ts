/**
 * Progress reporting, decoupled from the terminal: pipeline functions take a ProgressSink and
 * report named stages; the CLI turns them into bars on stderr, tests pass silentProgress.
 */

/** One running stage: call update with work done (same units as total), then stop. */
export interface ProgressStage {
  update(done: number): void;
  stop(): void;
}

/** Receives stages as they start. */
export interface ProgressSink {
  stage(label: string, total: number): ProgressStage;
}

/** A sink that shows nothing. */
export const silentProgress: ProgressSink = {
  stage: () => ({ update: () => {}, stop: () => {} }),
};
