/**
 * A sweep's progress on stderr: a bar redrawn in place on a terminal, and otherwise (a CI
 * log) one plain line every few seconds, so logs stay short but show the job is alive.
 */
import type { CliIo } from './io.js';

/** Seconds between plain lines when stderr is not a terminal. */
export const LOG_EVERY_MS = 5000;
/** Milliseconds between redraws of the bar, so drawing never costs more than the runs. */
const DRAW_EVERY_MS = 100;
const BAR = 24;

function formatEta(ms: number): string {
  const s = Math.ceil(ms / 1000);
  if (s < 90) return `${s} s`;
  const m = Math.round(s / 60);
  return m < 90 ? `${m} min` : `${(m / 60).toFixed(1)} h`;
}

/** Tracks done/total and failures, and draws them on stderr. */
export class SweepProgress {
  private done = 0;
  private failed = 0;
  private readonly started: number;
  private lastDraw = -Infinity;
  private drawn = false;

  constructor(
    private readonly io: CliIo,
    private readonly total: number,
    private readonly now: () => number = Date.now,
  ) {
    this.started = now();
    // a log gets its first line only after LOG_EVERY_MS, so short sweeps stay silent
    if (!io.stderrIsTTY) this.lastDraw = this.started;
  }

  /** The progress line, without control characters. */
  line(): string {
    const { done, total, failed } = this;
    const elapsed = this.now() - this.started;
    const eta = done > 0 && done < total ? `, about ${formatEta((elapsed / done) * (total - done))} left` : '';
    const fails = `${failed} failed`;
    if (!this.io.stderrIsTTY) return `sweep: ${done}/${total} seeds, ${fails}${eta}`;
    const filled = total === 0 ? BAR : Math.round((done / total) * BAR);
    return `[${'#'.repeat(filled)}${'.'.repeat(BAR - filled)}] ${done}/${total} seeds  ${fails}${eta}`;
  }

  /** Counts one finished seed and redraws when it is time. */
  seed(failed: boolean): void {
    this.done++;
    if (failed) this.failed++;
    const t = this.now();
    const every = this.io.stderrIsTTY ? DRAW_EVERY_MS : LOG_EVERY_MS;
    if (t - this.lastDraw < every && this.done < this.total) return;
    if (!this.io.stderrIsTTY && this.done >= this.total) return;
    this.lastDraw = t;
    if (this.io.stderrIsTTY) {
      this.io.stderr(`\r${this.line()}\x1b[K`);
      this.drawn = true;
    } else this.io.stderr(`${this.line()}\n`);
  }

  /** Clears the bar, so what follows starts on a clean line. */
  finish(): void {
    if (this.drawn) this.io.stderr('\r\x1b[K');
  }
}
