/**
 * The history of a run, cheap to rewind. Every computed event keeps a one-line record
 * (with its digest); worlds are kept in a contiguous window near the cursor (one step per
 * event, so consecutive worlds share structure) and as keyframes further
 * back. Any other world is recomputed from the nearest keyframe, which is exact because
 * the engine is deterministic.
 */
import type { Engine, EngineEvent, World } from '../engine/index.js';
import { DigestChain, type ReplayEvent } from './replay.js';

export interface HistoryOptions {
  /** Worlds kept one per event around the cursor: at least this many, at most twice (default 4096). */
  readonly window?: number;
  /** Events between keyframes (default 64). */
  readonly keyframeInterval?: number;
  /** Keyframes kept; beyond this every other one is dropped and the interval doubles (default 32768). */
  readonly maxKeyframes?: number;
  /** Estimated bytes the keyframes may take before they are thinned the same way (default 256 MiB). */
  readonly keyframeBytes?: number;
}

export const HISTORY_DEFAULTS = { window: 4096, keyframeInterval: 64, maxKeyframes: 32768, keyframeBytes: 256 * 1024 * 1024 } as const;

/** A rough size of a world on its own (what a keyframe costs), from what it holds. */
export function estimateWorldBytes(w: World): number {
  let bytes = 2048;
  for (const id in w.clusters) bytes += w.clusters[id].rho.data.byteLength + 200;
  for (const id in w.nodes) {
    const n = w.nodes[id];
    bytes += 300 + 250 * n.inbox.length + 250 * Object.keys(n.pairs).length;
  }
  bytes += 150 * Object.keys(w.qubits).length + 120 * w.queue.length + 300 * Object.keys(w.inflight).length;
  // delivery records are shared by every world (an immutable list), so they cost a keyframe nothing
  bytes += 200 * Object.keys(w.links).length;
  return bytes;
}

export class History {
  /** One record per computed event, in order. */
  readonly records: ReplayEvent[] = [];
  /** Called with each newly computed event and the world after it (breakpoint bookkeeping). */
  onNewEvent?: (ev: EngineEvent, world: World) => void;

  private readonly window: number;
  private interval: number;
  private readonly maxKeyframes: number;
  private readonly keyframeBudget: number;
  private keyframeTotal = 0;
  private readonly keyframes = new Map<number, { world: World; bytes: number }>();
  private frontierWorld: World;
  private readonly chain = new DigestChain();
  /** Worlds lo..lo+seg.length-1 (world n is the world after n events). */
  private lo = 0;
  private seg: World[];
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
    this.keyframeBudget = opts.keyframeBytes ?? HISTORY_DEFAULTS.keyframeBytes;
    const w0 = engine.initial(seed);
    this.frontierWorld = w0;
    this.keyframes.set(0, { world: w0, bytes: 0 });
    this.seg = [w0];
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

  /** Estimated bytes held by keyframes. */
  get keyframeBytes(): number {
    return this.keyframeTotal;
  }

  private remember(n: number, w: World): void {
    if (n % this.interval !== 0 || this.keyframes.has(n)) return;
    const bytes = estimateWorldBytes(w);
    this.keyframes.set(n, { world: w, bytes });
    this.keyframeTotal += bytes;
    while (this.keyframes.size > this.maxKeyframes || (this.keyframeTotal > this.keyframeBudget && this.keyframes.size > 2)) {
      // thin out: keep every other keyframe and double the interval
      this.interval *= 2;
      for (const [k, kf] of [...this.keyframes]) {
        if (k % this.interval !== 0) {
          this.keyframes.delete(k);
          this.keyframeTotal -= kf.bytes;
        }
      }
    }
  }

  private record(ev: EngineEvent, after: World): void {
    this.records.push(this.chain.next(ev, after));
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
          this.records.push(this.chain.next(ev, d));
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

  /** The world after `n` events (n ≤ frontier); held worlds are returned, others recomputed without moving the window. */
  worldAt(n: number): World {
    if (n === this.frontier) return this.frontierWorld;
    const i = n - this.lo;
    if (i >= 0 && i < this.seg.length) return this.seg[i];
    return this.replayTo(n).world;
  }

  /** Keyframe indices below `n`, newest first (at most `max`). */
  keyframesBelow(n: number, max: number): number[] {
    const out: number[] = [];
    for (let k = n - 1 - ((n - 1) % this.interval); k >= 0 && out.length < max; k -= this.interval) {
      if (this.keyframes.has(k)) out.push(k);
    }
    return out;
  }

  /** The world of a keyframe (undefined when none is held at that index). */
  keyframe(k: number): World | undefined {
    return this.keyframes.get(k)?.world;
  }

  private nearestKeyframe(n: number): [number, World] {
    // keyframes sit at multiples of the interval (older thinning only removed some), so look there first
    for (let k = n - (n % this.interval); k > 0; k -= this.interval) {
      const kf = this.keyframes.get(k);
      if (kf) return [k, kf.world];
    }
    return [0, this.keyframes.get(0)!.world];
  }

  /** Recomputes the world after n events (and the event that led to it) from the nearest keyframe before it. */
  replayTo(n: number): { world: World; event: EngineEvent | null } {
    if (n === 0) return { world: this.keyframes.get(0)!.world, event: null };
    const [k, kw] = this.nearestKeyframe(n - 1);
    const r = this.engine.advance(kw, n - k);
    return { world: r.world, event: r.events[r.events.length - 1] ?? null };
  }

  /**
   * The event that led to world n (null for n = 0). Events are not kept with the worlds
   * (they would double the history's memory); the last one asked for is cached.
   */
  eventAt(n: number): EngineEvent | null {
    if (n === 0) return null;
    if (this.cachedEvent?.n === n) return this.cachedEvent.event;
    const i = n - 1 - this.lo;
    const event = i >= 0 && i < this.seg.length ? this.engine.step(this.seg[i]).event : this.replayTo(n).event;
    this.cachedEvent = { n, event };
    return event;
  }

  private cachedEvent?: { n: number; event: EngineEvent | null };

  /** Places the window at world n (keeping it when n is already held) and returns that world. */
  place(n: number): World {
    const i = n - this.lo;
    if (i >= 0 && i < this.seg.length) return this.seg[i];
    const r = this.replayTo(n);
    if (r.event) this.cachedEvent = { n, event: r.event };
    this.lo = n;
    this.seg = [r.world];
    return r.world;
  }

  /** Moves from world n to world n+1, extending the frontier if needed; null at the end of the run. */
  forward(n: number): World | null {
    const i = n + 1 - this.lo;
    if (i >= 1 && i < this.seg.length) return this.seg[i];
    if (n + 1 > this.frontier && this.ended) return null;
    const cur = this.place(n);
    const { world, event } = this.engine.step(cur);
    if (!event) {
      this.ended = true;
      return null;
    }
    if (n + 1 > this.frontier) {
      this.record(event, world);
      this.frontierWorld = world;
    }
    this.cachedEvent = { n: n + 1, event };
    // the window holds consecutive worlds: keep the part up to the cursor and add the new one
    if (this.seg.length > n + 1 - this.lo) this.seg.length = n + 1 - this.lo;
    this.seg.push(world);
    // let it grow to twice its size, then drop the older half at once (amortised constant time)
    if (this.seg.length > 2 * this.window) {
      const drop = this.seg.length - this.window;
      this.seg = this.seg.slice(drop);
      this.lo += drop;
    }
    return world;
  }

  /** Moves from world n to world n−1, rebuilding the window backwards when needed; null at the start. */
  back(n: number): World | null {
    if (n <= 0) return null;
    const i = n - 1 - this.lo;
    if (i >= 0 && i < this.seg.length) return this.seg[i];
    // rebuild a window ending at the cursor: one batch to its start, then one produce per event
    const span = Math.min(n, Math.max(16, Math.floor(this.window / 4)));
    const start = n - span;
    const worlds: World[] = [this.replayTo(start).world];
    let w = worlds[0];
    for (let k = start; k < n; k++) {
      w = this.engine.step(w).world;
      worlds.push(w);
    }
    this.lo = start;
    this.seg = worlds;
    return this.seg[n - 1 - start];
  }
}
