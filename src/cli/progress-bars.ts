/** Progress bars on stderr (cli-progress) for stages that run longer than a second. */
import type cliProgress from 'cli-progress';
import type { ProgressSink } from '../progress.js';
import { silentProgress } from '../progress.js';

/** A sink that draws a bar for each stage once it has run for a second; silent when quiet or stderr is not a TTY and FRAGPLAN_PROGRESS is unset. */
export function terminalProgress(quiet: boolean): ProgressSink {
  if (quiet) return silentProgress;
  const tty = process.stderr.isTTY || process.env.FRAGPLAN_PROGRESS === '1';
  // the bar library is loaded only when bars can be shown; a bar appears after a second, by then it is here
  let bars: typeof cliProgress | null = null;
  if (tty) void import('cli-progress').then((m) => { bars = m.default; }).catch(() => {});
  return {
    stage(label: string, total: number) {
      const t0 = Date.now();
      let bar: cliProgress.SingleBar | null = null;
      let last = 0;
      const show = (done: number): void => {
        if (!bar && bars && Date.now() - t0 > 1000) {
          bar = new bars.SingleBar(
            { format: `${label.padEnd(22)} [{bar}] {percentage}% {eta_formatted}`, stream: process.stderr, noTTYOutput: !process.stderr.isTTY, notTTYSchedule: 2000, hideCursor: false, clearOnComplete: false },
            bars.Presets.shades_classic,
          );
          bar.start(total, done);
        } else bar?.update(done);
      };
      return {
        update(done: number) {
          last = done;
          if (tty) show(done);
        },
        stop() {
          if (bar) { bar.update(Math.max(last, total)); bar.stop(); }
        },
      };
    },
  };
}
