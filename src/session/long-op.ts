/**
 * Long operations in slices: a go to an event or a time, a continue or a reverse-continue,
 * written as generators that yield after each chunk of events. A caller runs them for a few
 * milliseconds at a time (`run`), so a terminal stays responsive between slices, and may
 * cancel one at any moment (`cancel`), which leaves the cursor on a valid world. Run to the
 * end at once (`finish`) they are the plain synchronous operations.
 */

/** How far a long operation has come. */
export interface Progress {
  /** What it is doing, e.g. "going to event 300000". */
  readonly label: string;
  /** Events gone through so far. */
  readonly done: number;
  /** Events it will go through in all, when known. */
  readonly total: number | null;
  /** Simulated time reached (ns). */
  readonly time: number;
}

/** Why a continue, reverse-continue or jump ended (see session.ts). */
export interface OpStop {
  readonly reason: string;
  readonly detail: string;
}

/** Events per chunk to aim for, so one chunk takes about this many milliseconds. */
const SLICE_MS = 8;

/**
 * Milliseconds from some fixed moment. The session reads no clock of its own: a caller that
 * runs long operations in slices (the debugger) passes one, and only the sizes of chunks and
 * slices depend on it, never what is computed.
 */
export type Clock = () => number;

/** Events per chunk without a clock: nobody waits between chunks, so they can be long. */
const UNTIMED_CHUNK = 4096;

/** Sizes chunks of work: with a clock, to take about SLICE_MS each; without one, a fixed size. */
export class Pacer {
  size: number;

  constructor(private readonly clock?: Clock) {
    this.size = clock ? 512 : UNTIMED_CHUNK;
  }

  /** Runs one chunk (`work` is given its size and returns the events it ran) and sizes the next from its time. */
  chunk(work: (size: number) => number): number {
    if (!this.clock) return work(this.size);
    const t0 = this.clock();
    const events = work(this.size);
    if (events > 0) {
      const perEvent = Math.max(this.clock() - t0, 0.01) / events;
      const want = Math.round(SLICE_MS / perEvent);
      this.size = Math.min(1 << 20, Math.max(16, Math.round((this.size + want) / 2)));
    }
    return events;
  }
}

export class LongOp<S extends OpStop> {
  private result: S | undefined;
  /** The last progress reported. */
  progress: Progress;

  constructor(
    private readonly steps: Generator<Progress, S>,
    private readonly stopHere: () => S,
    first: Progress,
    private readonly clock?: Clock,
  ) {
    this.progress = first;
  }

  /** Whether it has finished (or was cancelled). */
  get done(): boolean {
    return this.result !== undefined;
  }

  /**
   * Runs chunks for about `ms` milliseconds (one chunk when there is no clock); the stop once
   * it has finished, else undefined.
   */
  run(ms: number): S | undefined {
    if (this.result) return this.result;
    const clock = this.clock;
    const end = clock ? clock() + ms : 0;
    do {
      const r = this.steps.next();
      if (r.done) {
        this.result = r.value;
        return r.value;
      }
      this.progress = r.value;
    } while (clock !== undefined && clock() < end);
    return undefined;
  }

  /** Runs to the end. */
  finish(): S {
    for (;;) {
      const r = this.run(1e9);
      if (r) return r;
    }
  }

  /** Stops where it is: the cursor stays on the world reached, a valid moment to inspect. */
  cancel(): S {
    if (this.result) return this.result;
    this.steps.return(undefined as never);
    this.result = this.stopHere();
    return this.result;
  }
}
