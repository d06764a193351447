/**
 * The history of a run, cheap to rewind and bounded in memory. Every computed event keeps a
 * compact record (time, node and kind, digest: about 20 bytes, in typed-array columns), and
 * the one-line summaries of the most recent events. Worlds are kept one per event in a
 * window near the cursor (consecutive worlds share structure) and as keyframes further back.
 * Any other world is recomputed from the nearest keyframe before it, which is exact because
 * the engine is deterministic.
 *
 * One budget (`--history-mb`) bounds all of it: records, the window and keyframes. Beyond it,
 * keyframes thin out: a keyframe's worth grows with how round its event number is and shrinks
 * with its distance from the cursor, so they stay dense near the cursor and grow sparser,
 * about logarithmically, further away. A jump re-simulates from the nearest keyframe.
 */
import type { Engine, EngineEvent, World } from '../engine/index.js';
import { codeOf, EventColumns, KINDS } from './replay-columns.js';
import { DigestChain, type ReplayEvent } from './replay.js';

export interface HistoryOptions {
  /** Events around the cursor whose worlds are at hand (see STRIDE): at least this many, at most twice (default 4096). */
  readonly window?: number;
  /** Events between keyframes where they are densest (default 128). */
  readonly keyframeInterval?: number;
  /** Bytes that records, the window and keyframes may take together (default 256 MiB). */
  readonly budgetBytes?: number;
  /** The earlier name of `budgetBytes`. */
  readonly keyframeBytes?: number;
}

export const HISTORY_DEFAULTS = { window: 4096, keyframeInterval: 128, budgetBytes: 256 * 1024 * 1024 } as const;

/** Summaries kept for the most recently computed events (older ones are recomputed when asked). */
const SUMMARIES = 8192;

/** A rough size of a world on its own (what a keyframe costs), from what it holds. */
export function estimateWorldBytes(w: World): number {
  let bytes = 2048;
  for (const c of w.clusters.values()) bytes += c.rho.data.byteLength + 200;
  for (const id in w.nodes) {
    const n = w.nodes[id];
    bytes += 300 + 250 * n.inbox.length + 250 * n.pairs.length;
  }
  bytes += 150 * w.qubits.size + 120 * w.queue.length + 300 * w.inflight.size;
  // delivery records are shared by every world (an append-only log), so they cost a keyframe nothing
  bytes += 200 * Object.keys(w.links).length;
  return bytes;
}

/** Trailing zero bits of a positive whole number (how "round" it is). */
function roundness(x: number): number {
  let k = 0;
  while (x > 0 && x % 2 === 0) {
    x /= 2;
    k++;
  }
  return k;
}

/**
 * As the cursor moves forward, the window holds every STRIDE-th world (and its first); a
 * world between is recomputed from the held one before it, at most STRIDE − 1 steps, and
 * kept a while among the RECENT worlds last computed, so a run of single steps back costs
 * under one step each. Consecutive worlds share most of their structure, but each still has
 * its own small maps and arrays (about 3 KiB on a 17-site chain): holding a quarter of them
 * is what keeps the window's memory per event near a twentieth of a deep copy. A stretch
 * rebuilt for stepping back after a jump is held whole.
 */
const STRIDE = 4;
const RECENT = 16;

interface Keyframe {
  readonly world: World;
  readonly bytes: number;
}

export class History {
  /** One compact record per computed event, in order. */
  readonly records: EventColumns;
  /** Called with each newly computed event and the world after it (breakpoint bookkeeping, the timeline). */
  onNewEvent?: (ev: EngineEvent, world: World) => void;

  private readonly window: number;
  private readonly base: number;
  private readonly budget: number;
  private keyframeTotal = 0;
  private readonly keyframes = new Map<number, Keyframe>();
  private frontierWorld: World;
  private readonly chain = new DigestChain();
  private readonly nodeIndex = new Map<string, number>();
  /** The texts of the events stepped through or shown last (older ones are rebuilt around an index when asked). */
  private readonly summaryText: (string | undefined)[] = new Array<string | undefined>(SUMMARIES);
  private readonly summaryAt = new Int32Array(SUMMARIES).fill(-1);
  /**
   * Worlds lo..lo+seg.length-1 (world n is the world after n events). The first and those
   * whose index is a multiple of STRIDE are always held; others may be gaps, read through
   * `segWorld`.
   */
  private lo = 0;
  private seg: (World | undefined)[];
  /** The RECENT worlds last recomputed or dropped from the window, by index modulo RECENT. */
  private readonly recentAt = new Float64Array(RECENT).fill(-1);
  private readonly recentWorld: (World | undefined)[] = new Array<World | undefined>(RECENT);
  /** The frontier may not be extended past a stall or idle end. */
  private ended = false;
  /** Where the cursor is, for keeping keyframes dense around it. */
  private focus = 0;
  /** Bytes a world of the window costs on top of its neighbours (a running estimate). */
  private windowWorldBytes = 0;

  constructor(
    readonly engine: Engine,
    readonly seed: number,
    opts: HistoryOptions = {},
  ) {
    this.window = Math.max(2, opts.window ?? HISTORY_DEFAULTS.window);
    this.base = Math.max(1, opts.keyframeInterval ?? HISTORY_DEFAULTS.keyframeInterval);
    this.budget = opts.budgetBytes ?? opts.keyframeBytes ?? HISTORY_DEFAULTS.budgetBytes;
    engine.net.nodeIds.forEach((id, i) => this.nodeIndex.set(id, i));
    this.records = new EventColumns(engine.net.nodeIds, KINDS);
    const w0 = engine.initial(seed);
    this.frontierWorld = w0;
    this.keyframes.set(0, { world: w0, bytes: 0 });
    this.seg = [w0];
    this.windowWorldBytes = Math.ceil(estimateWorldBytes(w0) / 4);
  }

  /** Events computed so far. */
  get frontier(): number {
    return this.records.length;
  }

  /** True once the run can go no further (stall or idle). */
  get atEnd(): boolean {
    return this.ended;
  }

  /** Number of keyframes held. */
  get keyframeCount(): number {
    return this.keyframes.size;
  }

  /** Events between keyframes where they are densest. */
  get keyframeInterval(): number {
    return this.base;
  }

  /** Indices of the worlds currently held one per event. */
  get windowRange(): [number, number] {
    return [this.lo, this.lo + this.seg.length - 1];
  }

  /** Simulated time of the last event computed (0 before any). */
  get frontierTime(): number {
    return this.frontierWorld.time;
  }

  /**
   * Makes world n quick to place (n ≤ frontier): re-simulates from the nearest keyframe in
   * chunks of about `chunk` events, yielding progress between them, and leaves the world in
   * the window. Nothing to do when n is held already.
   */
  *seek(n: number, chunk: number): Generator<{ label: string; done: number; total: number; time: number }, void> {
    if (n === this.frontier || (n >= this.lo && n < this.lo + this.seg.length) || this.keyframes.has(n)) return;
    let [k, w] = this.nearestKeyframe(n);
    const total = n - k;
    const from = k;
    while (k < n) {
      const step = Math.min(n - k, Math.max(this.base, chunk - (chunk % this.base)) - (k % this.base));
      const r = this.engine.advance(w, step, {}, { keep: 'none', detail: false });
      w = r.world;
      k += r.count;
      if (r.count < step) break;
      if (k < n && k % this.base === 0 && Math.abs(k - this.focus) < 64 * this.base) this.remember(k, w);
      if (k < n) yield { label: n === 0 ? 'going to the start' : `going to event ${n - 1}`, done: k - from, total, time: w.time };
    }
    this.lo = k;
    this.seg = [w];
  }

  /** Estimated bytes held: records, the window and keyframes. */
  get bytes(): number {
    // a held world of the window costs about two single events' worth (it is STRIDE events on from the one before)
    const held = Math.ceil(this.seg.length / STRIDE) + 1 + RECENT;
    return this.recordBytes + held * 2 * this.windowWorldBytes + this.keyframeTotal;
  }

  /** Estimated bytes held by keyframes. */
  get keyframeBytes(): number {
    return this.keyframeTotal;
  }

  private get recordBytes(): number {
    return this.records.length * 20 + SUMMARIES * 120;
  }

  /** Tells the history where the cursor is, so keyframes stay dense there. */
  setFocus(n: number): void {
    this.focus = n;
  }

  // ------------------------------------------------------------------ records

  /** The record of event i (its summary recomputed when it is no longer kept). */
  record(i: number): ReplayEvent {
    const r = this.records.at(i);
    r.summary = this.summary(i);
    return r;
  }

  /** Time of event i (ns). */
  timeOf(i: number): number {
    return this.records.time(i);
  }

  /** The one-line summary of event i. */
  summary(i: number): string {
    const slot = i % SUMMARIES;
    if (this.summaryAt[slot] === i) return this.summaryText[slot]!;
    // recompute the neighbourhood at once: panes ask for runs of lines
    const from = Math.max(0, i - 64);
    const to = Math.min(this.frontier, i + 64);
    const [k, kw] = this.nearestKeyframe(from);
    let n = k;
    this.engine.advance(kw, to - k, {
      after: (ev) => {
        if (n >= from) this.keepSummary(n, ev.summary);
        n++;
        return false;
      },
    }, { keep: 'none', detail: false });
    return this.summaryAt[slot] === i ? this.summaryText[slot]! : '';
  }

  private keepSummary(i: number, text: string): void {
    const slot = i % SUMMARIES;
    this.summaryAt[slot] = i;
    this.summaryText[slot] = text;
  }

  /** The number of events whose time is at most t. */
  countUpTo(t: number): number {
    let lo = 0;
    let hi = this.records.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.records.time(mid) <= t) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  private record1(ev: EngineEvent, after: World, keepText: boolean): void {
    this.chain.advance(ev, after);
    this.records.push(ev.time, codeOf(this.nodeIndex.get(ev.node)!, ev.type), this.chain.hi, this.chain.lo);
    // a step keeps its event's text for the panes; a long extension does not (the texts near
    // where it stops are rebuilt when a pane asks, and keeping them would keep the events alive)
    if (keepText) this.keepSummary(ev.index, ev.summary);
    this.onNewEvent?.(ev, after);
  }

  // ------------------------------------------------------------------ keyframes

  private remember(n: number, w: World): void {
    if (n % this.base !== 0 || this.keyframes.has(n)) return;
    const bytes = estimateWorldBytes(w);
    this.keyframes.set(n, { world: w, bytes });
    this.keyframeTotal += bytes;
    if (this.bytes > this.budget) this.thin();
  }

  /** A keyframe's worth: rounder event numbers and nearness to the cursor count for more. */
  private worth(k: number): number {
    const d = Math.abs(k - this.focus) / this.base;
    return roundness(k / this.base) - Math.floor(Math.log2(1 + d / 64));
  }

  /** Drops the keyframes worth least until the history is back under 90 % of its budget. */
  private thin(): void {
    const target = this.budget * 0.9;
    const all = [...this.keyframes.keys()].filter((k) => k !== 0);
    all.sort((a, b) => this.worth(a) - this.worth(b) || Math.abs(b - this.focus) - Math.abs(a - this.focus));
    for (const k of all) {
      if (this.bytes <= target) break;
      this.keyframeTotal -= this.keyframes.get(k)!.bytes;
      this.keyframes.delete(k);
    }
  }

  /** The latest held world at or before n: a keyframe, a world of the window, or the frontier. */
  private nearestKeyframe(n: number): [number, World] {
    let best = 0;
    for (const k of this.keyframes.keys()) if (k <= n && k > best) best = k;
    // the window's worlds are as good as keyframes
    if (n >= this.lo) {
      let i = Math.min(n, this.lo + this.seg.length - 1) - this.lo;
      while (this.seg[i] === undefined) i--;
      if (this.lo + i > best) return [this.lo + i, this.seg[i]!];
    }
    if (n >= this.frontier && this.frontier > best) return [this.frontier, this.frontierWorld];
    return [best, this.keyframes.get(best)!.world];
  }

  /** The whole events from..to−1 (with their action phrases), recomputed from the nearest keyframe. */
  detailedEvents(from: number, to: number): EngineEvent[] {
    if (to <= from) return [];
    const [k, kw] = this.nearestKeyframe(from);
    const w = k < from ? this.engine.advance(kw, from - k, {}, { keep: 'none', detail: false }).world : kw;
    return this.engine.advance(w, to - from, {}, { keep: 'all', detail: true }).events;
  }

  /** Keyframe indices below `n`, newest first (at most `max`). */
  keyframesBelow(n: number, max: number): number[] {
    return [...this.keyframes.keys()].filter((k) => k < n).sort((a, b) => b - a).slice(0, max);
  }

  /** The world of a keyframe (undefined when none is held at that index). */
  keyframe(k: number): World | undefined {
    return this.keyframes.get(k)?.world;
  }

  // ------------------------------------------------------------------ moving

  /**
   * Extends the frontier by up to `max` events in batches, stopping early when `stop` says so
   * after an event (or `before` refuses the next one). Returns the number of events applied.
   */
  extend(max: number, stop?: (ev: EngineEvent, w: World) => boolean, before?: (t: number) => boolean): number {
    let done = 0;
    const detail = this.onNewEvent !== undefined;
    while (!this.ended && done < max) {
      let halt = false;
      const r = this.engine.advance(
        this.frontierWorld,
        Math.min(this.base - (this.records.length % this.base), max - done),
        {
          before: before ? (_d, t) => (before(t) ? ((halt = true), true) : false) : undefined,
          after: (ev, d) => {
            // keyframes and digests need the world after this event; within a batch that is the draft
            this.record1(ev, d, false);
            if (stop?.(ev, d)) halt = true;
            return halt;
          },
        },
        { keep: 'none', detail },
      );
      done += r.count;
      this.frontierWorld = r.world;
      this.remember(this.records.length, r.world);
      if (r.exhausted) this.ended = true;
      if (halt || r.count === 0) break;
    }
    return done;
  }

  /** The world after `n` events (n ≤ frontier); held worlds are returned, others recomputed without moving the window. */
  worldAt(n: number): World {
    if (n === this.frontier) return this.frontierWorld;
    const i = n - this.lo;
    if (i >= 0 && i < this.seg.length) return this.segWorld(i);
    return this.replayTo(n).world;
  }

  /**
   * Recomputes the world after n events (and the event that led to it) from the nearest
   * keyframe before it, leaving keyframes behind on the way where they are worth keeping.
   */
  replayTo(n: number, detail = true): { world: World; event: EngineEvent | null } {
    if (n === 0) return { world: this.keyframes.get(0)!.world, event: null };
    let [k, w] = this.nearestKeyframe(n - 1);
    let event: EngineEvent | null = null;
    // in steps of the keyframe interval, so the way there can be kept as keyframes
    while (k < n) {
      const step = Math.min(n - k, this.base - (k % this.base));
      const r = this.engine.advance(w, step, {}, { keep: 'last', detail: detail && k + step === n });
      w = r.world;
      k += r.count;
      event = r.events[0] ?? event;
      if (r.count < step) break;
      if (k < n && Math.abs(k - this.focus) < 64 * this.base) this.remember(k, w);
    }
    return { world: w, event };
  }

  /**
   * The event that led to world n (null for n = 0). Events are not kept with the worlds
   * (they would double the history's memory); the last one asked for is cached.
   */
  eventAt(n: number): EngineEvent | null {
    if (n === 0) return null;
    if (this.cachedEvent?.n === n) return this.cachedEvent.event;
    const i = n - 1 - this.lo;
    const event = i >= 0 && i < this.seg.length ? this.engine.step(this.segWorld(i)).event : this.replayTo(n).event;
    this.cachedEvent = { n, event };
    return event;
  }

  private cachedEvent?: { n: number; event: EngineEvent | null };

  /** Places the window at world n (keeping it when n is already held) and returns that world. */
  place(n: number): World {
    this.focus = n;
    const i = n - this.lo;
    if (i >= 0 && i < this.seg.length) return this.segWorld(i);
    // a keyframe is the world itself; the event that led to it is recomputed only if a pane asks
    const kw = this.keyframes.get(n);
    const r = n === this.frontier ? { world: this.frontierWorld, event: null } : kw ? { world: kw.world, event: null } : this.replayTo(n);
    if (r.event) this.cachedEvent = { n, event: r.event };
    this.lo = n;
    this.seg = [r.world];
    return r.world;
  }

  /** Moves from world n to world n+1, extending the frontier if needed; null at the end of the run. */
  forward(n: number): World | null {
    this.focus = n + 1;
    const i = n + 1 - this.lo;
    if (i >= 1 && i < this.seg.length) return this.segWorld(i);
    if (n + 1 > this.frontier && this.ended) return null;
    const cur = this.place(n);
    const { world, event } = this.engine.step(cur);
    if (!event) {
      this.ended = true;
      return null;
    }
    if (n + 1 > this.frontier) {
      this.record1(event, world, true);
      this.frontierWorld = world;
      this.remember(n + 1, world);
    }
    this.cachedEvent = { n: n + 1, event };
    // the window holds consecutive worlds: keep the part up to the cursor and add the new one
    if (this.seg.length > n + 1 - this.lo) this.seg.length = n + 1 - this.lo;
    // the world at the cursor stays held only if it is on the stride (or first)
    const last = this.seg.length - 1;
    const prev = this.seg[last];
    if (last > 0 && prev !== undefined && (this.lo + last) % STRIDE !== 0) {
      this.keepRecent(this.lo + last, prev);
      this.seg[last] = undefined;
    }
    this.seg.push(world);
    this.keepRecent(n + 1, world);
    // let it grow to twice its size, then drop the older half at once (amortised constant
    // time), so that the new first world is on the stride, and so held
    if (this.seg.length > 2 * this.window) {
      let drop = this.seg.length - this.window;
      drop -= (this.lo + drop) % STRIDE;
      if (drop > 0) {
        this.seg = this.seg.slice(drop);
        this.lo += drop;
      }
    }
    return world;
  }

  /** Moves from world n to world n−1, rebuilding the window backwards when needed; null at the start. */
  back(n: number): World | null {
    if (n <= 0) return null;
    this.focus = n - 1;
    const i = n - 1 - this.lo;
    if (i >= 0 && i < this.seg.length) return this.segWorld(i);
    // rebuild a window ending at the cursor: one batch to its start, then one step per event
    const span = Math.min(n, Math.max(16, Math.floor(this.window / 4)));
    const start = n - span;
    // a stretch rebuilt for stepping back is held whole: each of its worlds is about to be shown
    const worlds: (World | undefined)[] = [this.replayTo(start, false).world];
    let w = worlds[0]!;
    for (let k = start + 1; k <= n; k++) {
      w = this.engine.step(w).world;
      worlds.push(w);
    }
    this.lo = start;
    this.seg = worlds;
    return this.segWorld(n - 1 - start);
  }

  /** World lo+i of the window: held, recent, or recomputed from the held world before it. */
  private segWorld(i: number): World {
    const held = this.seg[i];
    if (held !== undefined) return held;
    const n = this.lo + i;
    const r = this.recent(n);
    if (r !== undefined) return r;
    let j = i - 1;
    let w = this.seg[j] ?? this.recent(this.lo + j);
    while (w === undefined) {
      j--;
      w = this.seg[j] ?? this.recent(this.lo + j);
    }
    for (let k = j + 1; k <= i; k++) {
      w = this.engine.step(w).world;
      this.keepRecent(this.lo + k, w);
    }
    return w;
  }

  private recent(n: number): World | undefined {
    const slot = n % RECENT;
    return this.recentAt[slot] === n ? this.recentWorld[slot] : undefined;
  }

  private keepRecent(n: number, w: World): void {
    const slot = n % RECENT;
    this.recentAt[slot] = n;
    this.recentWorld[slot] = w;
  }
}
