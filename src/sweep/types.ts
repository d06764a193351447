/** The sweep file of docs/cli.md (`sweep --json`, `merge --json`) and what workers exchange. */
import type { Spread } from '../session/stats.js';

export const SWEEP_FORMAT = 'bellstep/sweep@1';

/** How one seed ended: its expectations held (`ok`), failed, it stalled, or it erred. */
export type Outcome = 'ok' | 'failed' | 'stall' | 'error';

/** One seed's line in `runs`. */
export interface SweepRun {
  seed: number;
  outcome: Outcome;
  events: number;
  time_ns: number;
  delivered: number;
  /** Mean fidelity of the pairs this run delivered; null when it delivered none. */
  fidelity_mean: number | null;
  /** The failure with seed-specific detail taken out; null for a seed that passed. */
  signature: string | null;
}

/** The stop conditions every run of the sweep shares. */
export interface SweepLimits {
  until_ns: number | null;
  /** The event limit in force: `--events`, or run's default when neither limit is given. */
  events: number | null;
  /** `--break` conditions, present only when some were given (they stop runs, like limits). */
  breakpoints?: string[];
}

/** A group of seeds that failed the same way. */
export interface FailureGroup {
  signature: string;
  count: number;
  seeds: number[];
  explanation: string;
}

/** The object `sweep --json` and `merge --json` print. */
export interface SweepReport {
  format: typeof SWEEP_FORMAT;
  inputs: { program_set_sha256: string; noise_sha256: string | null };
  seeds: { from: number; to: number; shard: string | null; count: number };
  limits: SweepLimits;
  expectations: string[];
  runs: SweepRun[];
  stats: {
    runs: number;
    failed: number;
    failure_rate: { value: number | null; low95: number | null; high95: number | null };
    delivered_per_run: Spread;
    delivered_per_second: Spread;
    fidelity: Spread & { min: number | null };
  };
  failures: FailureGroup[];
}

/** Everything a worker needs to run seeds: the input texts and the flags, parsed once per worker. */
export interface SweepJob {
  readonly netFile: string;
  readonly netText: string;
  readonly noiseFile?: string;
  readonly noiseText?: string;
  readonly untilNs?: number;
  readonly maxEvents?: number;
  readonly breaks: readonly string[];
  readonly expects: readonly string[];
  /** Re-run failing seeds with a recorder and return their replay text. */
  readonly recordFailures: boolean;
}

/** What one seed gives back. */
export interface SeedResult {
  readonly run: SweepRun;
  /** Plain words for the signature; null for a seed that passed. */
  readonly explanation: string | null;
  /** The replay file's text, for a failing seed when the job records failures. */
  readonly replay?: string;
  /** Wall-clock milliseconds the seed took (for JUnit times only; never in the sweep file). */
  readonly ms: number;
}
