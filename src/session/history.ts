/**
 * The history of a run, cheap to rewind. Every computed event keeps a one-line record
 * (with its digest); worlds are kept in a contiguous window near the cursor (one immer
 * `produce` per event, so consecutive worlds share structure) and as keyframes further
 * back. Any other world is recomputed from the nearest keyframe, which is exact because
 * the engine is deterministic.
 */
import type { Engine, EngineEvent, World } from '../engine/index.js';
import { eventDigest, GENESIS_DIGEST } from './digest.js';
import { replayEvent, type ReplayEvent } from './replay.js';

export interface HistoryOptions {
  /** Worlds kept one per event around the cursor (default 4096). */
  readonly window?: number;
  /** Events between keyframes (default 1024). */
  readonly keyframeInterval?: number;
  /** Keyframes kept; beyond this every other one is dropped and the interval doubles (default 1024). */
  readonly maxKeyframes?: number;
}

export const HISTORY_DEFAULTS = { window: 4096, keyframeInterval: 1024, maxKeyframes: 1024 } as const;

interface Slot {
  world: World;
  /** The event that led to this world (null for the initial world). */
  event: EngineEvent | null;
}

export class History {
  /** One record per computed event, in order. */
  readonly records: ReplayEvent[] = [];
  /** Called with each newly computed event and the world after it (breakpoint bookkeeping). */
  onNewEvent?: (ev: EngineEvent, world: World) => void;

  private readonly window: number;
  private interval: number;
  private readonly maxKeyframes: number;
  private readonly keyframes = new Map<number, World>();
  private frontierWorld: World;
  private digest = GENESIS_DIGEST;
  /** Worlds for events lo..lo+seg.length-1. */
  private lo = 0;
  private seg: Slot[];
  /** The frontier may not be extended past a stall or idle end. */
  private ended = false;

  constructor(
    readonly engine: Engine,
    readonly seed: number,
    opts: HistoryOptions = {},
  ) {
    this.window = Math.max(2, opts.window ?? HISTORY_DEFAULTS.window);
    this.interval = Math.max(1, opts.keyframeInterval ?? HISTORY_DEFAULTS.keyframeInterval);
    this.maxKeyframes = Math.max(2, opts.maxKeyframes ?? HISTORY_DEFAULTS.maxKeyframes);
    const w0 = engine.initial(seed);
    this.frontierWorld = w0;
    this.keyframes.set(0, w0);
    this.seg = [{ world: w0, event: null }];
  }

  /** Events computed so far. */
  get frontier(): number {
    return this.records.length;
  }

  /** True once the run can go no further (stall or idle). */
  get atEnd(): boolean {
    return this.ended;
  }

  /** Number of keyframes held (for the memory bound). */
  get keyframeCount(): number {
    return this.keyframes.size;
  }

  /** Events between keyframes right now. */
  get keyframeInterval(): number {
    return this.interval;
  }

  /** Indices of the worlds currently held one per event. */
  get windowRange(): [number, number] {
    return [this.lo, this.lo + this.seg.length - 1];
  }

  private remember(n: number, w: World): void {
    if (n % this.interval !== 0 || this.keyframes.has(n)) return;
    this.keyframes.set(n, w);
    if (this.keyframes.size > this.maxKeyframes) {
      this.interval *= 2;
      for (const k of [...this.keyframes.keys()]) if (k % this.interval !== 0) this.keyframes.delete(k);
    }
  }

  private record(ev: EngineEvent, after: World): void {
    this.digest = eventDigest(this.digest, ev, after);
    this.records.push(replayEvent(ev, this.digest));
    this.remember(this.records.length, after);
    this.onNewEvent?.(ev, after);
  }

  /**
   * Extends the frontier by up to `max` events in batches, stopping early when `stop`
   * says so after an event. Returns the events applied.
   */
  extend(max: number, stop?: (ev: EngineEvent, w: World) => boolean, before?: (t: number) => boolean): EngineEvent[] {
    const out: EngineEvent[] = [];
    while (!this.ended && out.length < max) {
      let halt = false;
      const r = this.engine.advance(this.frontierWorld, Math.min(this.interval, max - out.length), {
        before: (_d, t) => (before?.(t) ? ((halt = true), true) : false),
        after: (ev, d) => {
          out.push(ev);
          // keyframes and digests need the world after this event; within a batch that is the draft
          this.digest = eventDigest(this.digest, ev, d);
          this.records.push(replayEvent(ev, this.digest));
          this.onNewEvent?.(ev, d);
          if (stop?.(ev, d)) halt = true;
          // end the batch at keyframe boundaries so the keyframe is a finished, frozen world
          return halt || this.records.length % this.interval === 0;
        },
      });
      this.frontierWorld = r.world;
      this.remember(this.records.length, r.world);
      if (r.exhausted) this.ended = true;
      if (halt || r.events.length === 0) break;
    }
    return out;
  }

  /** The world after `n` events (n ≤ frontier), recomputed from the nearest keyframe when not held. */
  worldAt(n: number): World {
    if (n === this.frontier) return this.frontierWorld;
    const i = n - this.lo;
    if (i >= 0 && i < this.seg.length) return this.seg[i].world;
    return this.replayTo(n).world;
  }

  private nearestKeyframe(n: number): [number, World] {
    let best = 0;
    for (const k of this.keyframes.keys()) if (k <= n && k > best) best = k;
    return [best, this.keyframes.get(best)!];
  }

  /** Recomputes the world after n events (and the event that led to it) from the nearest keyframe before it. */
  replayTo(n: number): Slot {
    if (n === 0) return { world: this.keyframes.get(0)!, event: null };
    const [k, kw] = this.nearestKeyframe(n - 1);
    const r = this.engine.advance(kw, n - k);
    return { world: r.world, event: r.events[r.events.length - 1] ?? null };
  }

  /** The slot (world and the event that led to it) after `n` events, placing the window there. */
  slot(n: number): Slot {
    const i = n - this.lo;
    if (i >= 0 && i < this.seg.length) {
      const s = this.seg[i];
      if (s.event || n === 0) return s;
    }
    const s = this.replayTo(n);
    this.lo = n;
    this.seg = [s];
    return s;
  }

  /** The slot after n+1 events, given the slot after n (the cursor); extends the frontier if needed. */
  forward(n: number): Slot | null {
    const i = n + 1 - this.lo;
    if (i >= 1 && i < this.seg.length && this.seg[i].event) return this.seg[i];
    if (n + 1 > this.frontier && this.ended) return null;
    const cur = this.slot(n);
    const { world, event } = this.engine.step(cur.world);
    if (!event) {
      this.ended = true;
      return null;
    }
    if (n + 1 > this.frontier) {
      this.record(event, world);
      this.frontierWorld = world;
    }
    const next = { world, event };
    // the window holds consecutive worlds: keep the tail near the cursor
    this.seg = this.seg.slice(0, n + 1 - this.lo);
    this.seg.push(next);
    if (this.seg.length > this.window) {
      const drop = this.seg.length - this.window;
      this.seg = this.seg.slice(drop);
      this.lo += drop;
    }
    return next;
  }

  /** The slot after n−1 events, given the cursor at n; rebuilds the window backwards when needed. */
  back(n: number): Slot | null {
    if (n <= 0) return null;
    const i = n - 1 - this.lo;
    if (i >= 0 && i < this.seg.length && (this.seg[i].event || n - 1 === 0)) return this.seg[i];
    // rebuild a window ending at the cursor: one batch to its start, then one produce per event
    const span = Math.min(n, Math.max(16, Math.floor(this.window / 4)));
    const start = n - span;
    const slots: Slot[] = [this.replayTo(start)];
    let w = slots[0].world;
    for (let k = start; k < n; k++) {
      const s = this.engine.step(w);
      slots.push({ world: s.world, event: s.event });
      w = s.world;
    }
    this.lo = start;
    this.seg = slots;
    return this.seg[n - 1 - start];
  }
}
