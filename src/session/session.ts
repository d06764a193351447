/**
 * A debugging session over the engine: a cursor into the run's history that steps forward
 * and back, continues to the next breakpoint or back to the previous hit, and jumps to an
 * event or a time. The TUI, `run` and the tests all drive it; it never imports React.
 */
import { plural } from '../model/words.js';
import { explainNode, hasNext, quiescence, stallReport, type Engine, type EngineEvent, type RuleExplanation, type StallEntry, type World } from '../engine/index.js';
import { evaluate, ExprError, formatValue } from '../expr/index.js';
import type { Value } from '../expr/types.js';
import { findingRule, lint, type Finding, type RuleOrigin } from '../model/index.js';
import { breakpointScanner, conditionHolds, parseBreakpoint, type Breakpoint, type Hit } from './breakpoints.js';
import { debugScope } from './debug-functions.js';
import { History, type HistoryOptions } from './history.js';
import { GENESIS_DIGEST } from './digest.js';
import { LongOp, Pacer, type Clock, type Progress } from './long-op.js';
import { replayHead } from './replay.js';
import { RECENT, ReplayWriter } from './replay-v2.js';
import { formatDuration } from '../model/units.js';
import type { Stop } from './summary.js';

/** Why a continue, reverse-continue or jump ended. */
export interface SessionStop {
  readonly reason: 'breakpoint' | 'stall' | 'idle' | 'start' | 'limit' | 'event' | 'time' | 'cancelled';
  readonly detail: string;
  readonly breakpoint?: number;
}

export interface Watch {
  readonly id: number;
  readonly spec: string;
  readonly bp: Breakpoint;
}

export interface WatchValue {
  readonly id: number;
  readonly spec: string;
  readonly value: string;
  /** Event index at which the value last changed, or undefined if unchanged within the held window. */
  readonly changedAt?: number;
  readonly error?: string;
}

export interface SessionOptions extends HistoryOptions {
  readonly seed?: number;
  /** Events a single continue may run before it stops with reason `limit` (default 1,000,000). */
  readonly continueLimit?: number;
  /** What long operations time their slices by (see long-op.ts); without one, they run in fixed chunks. */
  readonly clock?: Clock;
}

/** An explanation plus what the static analysis knows about the rule. */
export interface RuleReport extends RuleExplanation {
  /** Findings of `bellstep check` about this rule: why it may never fire. */
  readonly lint: readonly string[];
  /** The rule fired in the event at the cursor. */
  readonly firedNow: boolean;
  /** The line where the rule is written (in its role, for a rule a role made). */
  readonly line: number;
  /** Present when a role made the rule: the role, its values and the provenance text. */
  readonly from?: RuleOrigin;
}

export class Session {
  readonly history: History;
  private cursorAt = 0;
  private bps: Breakpoint[] = [];
  private watchList: Watch[] = [];
  private nextId = 1;
  private readonly hitEvents = new Map<number, Set<number>>();
  private lastStop: SessionStop = { reason: 'start', detail: 'nothing has happened yet' };
  private readonly findings: readonly Finding[];
  private readonly continueLimit: number;
  private readonly clock: Clock | undefined;

  constructor(
    readonly engine: Engine,
    opts: SessionOptions = {},
  ) {
    this.history = new History(engine, opts.seed ?? engine.net.noise.seed, opts);
    this.continueLimit = opts.continueLimit ?? 1_000_000;
    this.clock = opts.clock;
    this.findings = lint(engine.net.programSet, engine.net.noise);
  }

  get seed(): number {
    return this.history.seed;
  }

  /** Events applied at the cursor (the cursor's world is the world after this many events). */
  get cursor(): number {
    return this.cursorAt;
  }

  /** Events computed so far. */
  get total(): number {
    return this.history.frontier;
  }

  get stop(): SessionStop {
    return this.lastStop;
  }

  /** The world at the cursor. */
  world(): World {
    return this.history.place(this.cursorAt);
  }

  /** The event that led to the cursor's world (null at the start). */
  event(): EngineEvent | null {
    return this.history.eventAt(this.cursorAt);
  }

  /** Whether nothing can happen after the cursor's world, and why. */
  ending(): 'stall' | 'idle' | null {
    const w = this.world();
    if (hasNext(w)) return null;
    return quiescence(w);
  }

  // ------------------------------------------------------------------ stepping

  /** One event forward; false at the end of the run. */
  stepForward(): boolean {
    const next = this.history.forward(this.cursorAt);
    if (!next) {
      const end = this.ending() ?? 'idle';
      this.lastStop = { reason: end, detail: end === 'stall' ? 'the network stalled: nothing can happen, but pairs or messages are held' : 'nothing left to do' };
      return false;
    }
    this.cursorAt++;
    this.lastStop = { reason: 'event', detail: 'stepped one event forward' };
    return true;
  }

  /** One event back; false at the start. */
  stepBack(): boolean {
    if (this.cursorAt === 0) {
      this.lastStop = { reason: 'start', detail: 'nothing has happened yet' };
      return false;
    }
    this.history.back(this.cursorAt);
    this.cursorAt--;
    this.lastStop = { reason: 'event', detail: this.cursorAt ? 'stepped one event back' : 'nothing has happened yet' };
    return true;
  }

  /** Places the cursor after `n` events (extending the run if needed). */
  goto(n: number): SessionStop {
    return this.startGoto(n).finish();
  }

  /** Places the cursor after the last event at or before simulated time t (ns). */
  gotoTime(t: number): SessionStop {
    return this.startGotoTime(t).finish();
  }

  /** A go to event `n` in slices (see long-op.ts); Esc leaves the cursor on the world reached. */
  startGoto(n: number): LongOp<SessionStop> {
    const target = Math.max(0, Math.floor(n));
    const from = this.cursorAt;
    // the cursor after `target` events is on event #target−1, which is what the user asked for
    const label = target === 0 ? 'going to the start' : `going to event ${target - 1}`;
    const progress = (): Progress => ({ label, done: Math.abs(this.history.frontier - from), total: Math.abs(target - from), time: this.history.frontierTime });
    // a generator cannot be an arrow function, so the steps reach the session through a name
    // eslint-disable-next-line @typescript-eslint/no-this-alias
    const self = this;
    function* steps(): Generator<Progress, SessionStop> {
      const pace = new Pacer(self.clock);
      // keyframes are kept densest where the cursor is going
      self.history.setFocus(target);
      while (self.history.frontier < target && !self.history.atEnd) {
        const ran = pace.chunk((size) => self.history.extend(Math.min(size, target - self.history.frontier)));
        if (ran === 0) break;
        yield progress();
      }
      const to = Math.min(target, self.history.frontier);
      yield* self.history.seek(to, pace.size);
      self.cursorAt = to;
      self.history.place(to);
      self.lastStop = to < target ? { reason: self.ending() ?? 'idle', detail: `the run ends after ${plural(to, 'event')}` } : { reason: 'event', detail: 'went to this event' };
      return self.lastStop;
    }
    return new LongOp(steps(), () => this.stopAtFrontierOr(from, 'stopped on the way'), progress(), this.clock);
  }

  /** A go to simulated time t in slices. */
  startGotoTime(t: number): LongOp<SessionStop> {
    const from = this.cursorAt;
    const label = `going to ${formatDuration(t)}`;
    const progress = (): Progress => ({ label, done: this.history.frontier - from, total: null, time: this.history.frontierTime });
    // a generator cannot be an arrow function, so the steps reach the session through a name
    // eslint-disable-next-line @typescript-eslint/no-this-alias
    const self = this;
    function* steps(): Generator<Progress, SessionStop> {
      const pace = new Pacer(self.clock);
      const h = self.history;
      while (!h.atEnd && (h.frontier === 0 || h.timeOf(h.frontier - 1) <= t)) {
        h.setFocus(h.frontier);
        let halted = false;
        const ran = pace.chunk((size) => h.extend(size, undefined, (next) => (next > t ? (halted = true) : false)));
        if (halted || ran === 0) break;
        yield progress();
      }
      const to = h.countUpTo(t);
      yield* h.seek(to, pace.size);
      self.cursorAt = to;
      h.place(to);
      self.lastStop = { reason: 'time', detail: `at the last event up to the time asked for (${plural(to, 'event')})` };
      return self.lastStop;
    }
    return new LongOp(steps(), () => this.stopAtFrontierOr(from, 'stopped on the way'), progress(), this.clock);
  }

  /**
   * Where a cancelled forward operation leaves the cursor: on the frontier, if the operation
   * had moved past where it started, else where it was.
   */
  private stopAtFrontierOr(from: number, why: string): SessionStop {
    const at = Math.max(from, this.history.frontier > from ? this.history.frontier : from);
    this.cursorAt = at;
    this.history.place(at);
    this.lastStop = { reason: 'cancelled', detail: `${why} after ${plural(Math.abs(at - from), 'event')}` };
    return this.lastStop;
  }

  // ------------------------------------------------------------------ breakpoints

  /** Adds a breakpoint; throws InputError (with a fix) when the spec is wrong. */
  addBreakpoint(spec: string): Breakpoint {
    const bp = parseBreakpoint(this.engine.net, spec, this.nextId++);
    if (bp.kind === 'condition') conditionHolds(this.engine.net, this.world(), bp); // fail now, not mid-run
    this.bps.push(bp);
    this.hitEvents.set(bp.id, new Set());
    return bp;
  }

  removeBreakpoint(id: number): boolean {
    const before = this.bps.length;
    this.bps = this.bps.filter((b) => b.id !== id);
    this.hitEvents.delete(id);
    return this.bps.length < before;
  }

  enableBreakpoint(id: number, enabled: boolean): boolean {
    const i = this.bps.findIndex((b) => b.id === id);
    if (i < 0) return false;
    this.bps[i] = { ...this.bps[i], enabled };
    return true;
  }

  /** Breakpoints with their hit counts (distinct events seen hitting them). */
  breakpoints(): Breakpoint[] {
    return this.bps.map((b) => ({ ...b, hits: this.hitEvents.get(b.id)?.size ?? 0 }));
  }

  /** Runs forward from the cursor until a breakpoint hits, the run ends, or the limit. */
  continue(): SessionStop {
    return this.startContinue().finish();
  }

  /** A continue in slices; Esc leaves the cursor on the world reached. */
  startContinue(): LongOp<SessionStop> {
    const active = this.bps.filter((b) => b.enabled);
    const start = this.cursorAt;
    const scan = breakpointScanner(this.engine.net, active, this.world());
    let hit: (Hit & { at: number }) | undefined;
    const onEvent = (ev: EngineEvent, w: World): boolean => {
      const h = scan(ev, w);
      if (h) hit = { at: ev.index + 1, ...h };
      return h !== undefined;
    };
    let at = start;
    let time = this.world().time;
    const progress = (): Progress => ({ label: 'running forward', done: at - start, total: null, time });
    // a generator cannot be an arrow function, so the steps reach the session through a name
    // eslint-disable-next-line @typescript-eslint/no-this-alias
    const self = this;
    function* steps(): Generator<Progress, SessionStop> {
      const pace = new Pacer(self.clock);
      // events already computed: re-run them from the cursor, chunk by chunk
      let w = self.world();
      while (!hit && at < self.history.frontier) {
        const ran = pace.chunk((size) => {
          const r = self.engine.advance(w, Math.min(size, self.history.frontier - at), { after: onEvent }, { keep: 'none', detail: false });
          w = r.world;
          return r.count;
        });
        at += ran;
        time = w.time;
        if (ran === 0) break;
        if (!hit) yield progress();
      }
      while (!hit && at >= self.history.frontier && !self.history.atEnd && at - start < self.continueLimit) {
        self.history.setFocus(at);
        const ran = pace.chunk((size) => self.history.extend(Math.min(size, self.continueLimit - (at - start)), onEvent));
        at = self.history.frontier;
        time = self.history.frontierTime;
        if (ran === 0) break;
        if (!hit) yield progress();
      }
      return self.endContinue(hit, at, active);
    }
    return new LongOp(steps(), () => this.endContinue(undefined, at, active, true), progress(), this.clock);
  }

  private endContinue(hit: (Hit & { at: number }) | undefined, at: number, active: readonly Breakpoint[], cancelled = false): SessionStop {
    if (hit) {
      this.hitEvents.get(hit.bp.id)?.add(hit.at - 1);
      this.cursorAt = hit.at;
      this.history.place(hit.at);
      this.lastStop = { reason: 'breakpoint', detail: `breakpoint ${hit.bp.id}: ${hit.what}`, breakpoint: hit.bp.id };
      return this.lastStop;
    }
    const ran = at - this.cursorAt;
    this.cursorAt = at;
    this.history.place(at);
    if (cancelled) {
      this.lastStop = { reason: 'cancelled', detail: `stopped after ${plural(ran, 'event')}` };
      return this.lastStop;
    }
    const end = at >= this.history.frontier && this.history.atEnd ? this.ending() : null;
    if (end) {
      const onStall = active.find((b) => b.kind === 'stall');
      this.lastStop =
        end === 'stall'
          ? { reason: 'stall', detail: `the network stalled after ${plural(at, 'event')}`, breakpoint: onStall?.id }
          : { reason: 'idle', detail: `nothing left to do after ${plural(at, 'event')}` };
    } else this.lastStop = { reason: 'limit', detail: `ran ${plural(this.continueLimit, 'event')} without a breakpoint hit` };
    return this.lastStop;
  }

  /** Goes back to the last breakpoint hit before the cursor (or to the start). */
  reverseContinue(): SessionStop {
    return this.startReverse().finish();
  }

  /** A reverse-continue in slices: it searches back chunk by chunk; Esc leaves the cursor where it was. */
  startReverse(): LongOp<SessionStop> {
    const active = this.bps.filter((b) => b.enabled && b.kind !== 'stall');
    const chunk = Math.max(1024, this.history.keyframeInterval);
    const start = this.cursorAt;
    // a hit "at n" means the event that led to world n hit; look for the last one with n < cursor
    let hiAt = this.cursorAt - 1;
    const progress = (): Progress => ({ label: 'searching back', done: start - 1 - hiAt, total: start, time: hiAt > 0 ? this.history.timeOf(hiAt - 1) : 0 });
    // a generator cannot be an arrow function, so the steps reach the session through a name
    // eslint-disable-next-line @typescript-eslint/no-this-alias
    const self = this;
    function* steps(): Generator<Progress, SessionStop> {
      while (hiAt > 0 && active.length > 0) {
        const from = Math.max(0, hiAt - chunk);
        const w0 = self.history.worldAt(from);
        const scan = breakpointScanner(self.engine.net, active, w0);
        let last: (Hit & { at: number }) | undefined;
        self.engine.advance(w0, hiAt - from, {
          after: (ev, d) => {
            const h = scan(ev, d);
            if (h) last = { at: ev.index + 1, ...h };
            return false;
          },
        }, { keep: 'none', detail: false });
        if (last) {
          self.hitEvents.get(last.bp.id)?.add(last.at - 1);
          self.cursorAt = last.at;
          self.history.place(last.at);
          self.lastStop = { reason: 'breakpoint', detail: `breakpoint ${last.bp.id}: ${last.what}`, breakpoint: last.bp.id };
          return self.lastStop;
        }
        hiAt = from;
        yield progress();
      }
      self.cursorAt = 0;
      self.history.place(0);
      self.lastStop = { reason: 'start', detail: 'no earlier breakpoint hit; nothing has happened yet' };
      return self.lastStop;
    }
    return new LongOp(steps(), () => {
      this.lastStop = { reason: 'cancelled', detail: `search stopped; no hit between event ${Math.max(0, hiAt - 1)} and the cursor` };
      return this.lastStop;
    }, progress(), this.clock);
  }

  // ------------------------------------------------------------------ watches

  addWatch(spec: string): Watch {
    const bp = parseBreakpoint(this.engine.net, spec, 0, 'watch');
    if (bp.kind !== 'condition') throw new Error('a watch is an expression, not an event form');
    const w = { id: this.nextId++, spec: bp.spec, bp };
    this.watchList = [...this.watchList, w];
    return w;
  }

  removeWatch(id: number): boolean {
    const before = this.watchList.length;
    this.watchList = this.watchList.filter((w) => w.id !== id);
    return this.watchList.length < before;
  }

  private watchValue(w: Watch, world: World): string {
    const vals: string[] = [];
    const vars = w.bp.pairVars;
    if (vars.length === 0) return formatValue(evaluate(w.bp.compiled!, debugScope(this.engine.net, world)));
    // a watch over pair names shows one value per held pair
    const ids = new Set<string>();
    for (const n of Object.values(world.nodes)) for (const p of Object.values(n.pairs)) ids.add(p.id);
    for (const id of [...ids].sort()) {
      try {
        const v: Value = evaluate(w.bp.compiled!, debugScope(this.engine.net, world, new Map([[vars[0], id]])));
        vals.push(`${id}: ${formatValue(v)}`);
      } catch {
        // pairs held at one end only are skipped
      }
    }
    return vals.join(', ') || '(no pair)';
  }

  /** Each watch's value at the cursor and the event at which it last changed (within the held window). */
  watches(): WatchValue[] {
    // panes ask on every frame: compute once per cursor position and list of watches
    const c = this.watchCache;
    if (c && c.cursor === this.cursorAt && c.list === this.watchList) return c.values;
    const values = this.computeWatches();
    this.watchCache = { cursor: this.cursorAt, list: this.watchList, values };
    return values;
  }

  private watchCache?: { cursor: number; list: readonly Watch[]; values: WatchValue[] };

  private computeWatches(): WatchValue[] {
    const world = this.world();
    return this.watchList.map((w) => {
      let value: string;
      try {
        value = this.watchValue(w, world);
      } catch (e) {
        return { id: w.id, spec: w.spec, value: '?', error: e instanceof ExprError ? e.detail : String(e) };
      }
      return { id: w.id, spec: w.spec, value, changedAt: this.lastChange(w, value) };
    });
  }

  private valueOr(w: Watch, world: World): string {
    try {
      return this.watchValue(w, world);
    } catch {
      return '?';
    }
  }

  /**
   * The event at which a watch last changed to `value`: the largest n whose world differs.
   * It looks back through the held worlds first, then through keyframes (up to 256), and
   * replays the one keyframe interval where the change happened.
   */
  private lastChange(w: Watch, value: string): number | undefined {
    const [lo] = this.history.windowRange;
    const stop = Math.max(lo, this.cursorAt - 512, 0);
    for (let n = this.cursorAt - 1; n >= stop; n--) {
      if (this.valueOr(w, this.history.worldAt(n)) !== value) return n;
    }
    // worlds stop..cursor all hold `value`; find the newest keyframe before that which does not
    for (const k of this.history.keyframesBelow(stop, 256)) {
      const kw = this.history.keyframe(k)!;
      if (this.valueOr(w, kw) === value) continue;
      let last = k;
      this.engine.advance(kw, stop - k, {
        after: (ev, d) => {
          if (this.valueOr(w, d) !== value) last = ev.index + 1;
          return false;
        },
      });
      return last;
    }
    return undefined;
  }

  // ------------------------------------------------------------------ explanations

  /** Every rule of a node at the cursor, guard by guard, with what static analysis knows. */
  explain(node: string): RuleReport[] {
    const w = this.world();
    const ev = this.event();
    const rules = this.engine.net.rules.get(node) ?? [];
    return explainNode(this.engine.net, w, node).map((e, i) => {
      const rule = rules[i];
      const lint = this.findings.filter((f) => findingRule(f) === rule).map((f) => f.message);
      const firedNow = ev?.fires.some((f) => f.node === node && f.rule === e.rule) ?? false;
      return { ...e, lint, firedNow, ...(rule.from ? { from: rule.from } : {}), line: rule.pos.line };
    });
  }

  /** The stall report at the cursor (as in the run summary). */
  stallReport(): Record<string, StallEntry[]> {
    return stallReport(this.engine.net, this.world());
  }

  // ------------------------------------------------------------------ replay

  /** The replay file (`@2`) of everything computed so far. */
  exportReplay(stop?: Stop): string {
    const parts: string[] = [];
    this.writeReplay((c) => void parts.push(c), stop);
    return parts.join('');
  }

  /** Writes the replay of everything computed so far to `sink`, piece by piece. */
  writeReplay(sink: (chunk: string) => void, stop?: Stop): void {
    const { programSet, noise } = this.engine.net;
    const h = this.history;
    const n = h.frontier;
    const end = h.atEnd ? quiescence(h.worldAt(n)) : null;
    const s: Stop =
      stop ??
      (end === 'stall'
        ? { reason: 'stall', detail: `exported from the debugger: the network stalled after ${plural(n, 'event')}` }
        : end === 'idle'
          ? { reason: 'idle', detail: `exported from the debugger: nothing left to do after ${plural(n, 'event')}` }
          : { reason: 'events', detail: `exported from the debugger: the ${n === 1 ? 'one event' : `${n} events`} computed so far` });
    const head = replayHead(programSet, noise, {
      seed: this.seed,
      breakpoints: this.bps.map((b) => b.spec),
      expectations: [],
      limits: { until_ns: null, events: s.reason === 'events' ? n : null },
    });
    const writer = new ReplayWriter(head, this.engine.net.nodeIds, sink);
    const r = h.records;
    for (let i = 0; i < n; i++) {
      const [hi, lo] = r.digestHalves(i);
      // only the last events keep their one-line text in the file
      writer.add(r.time(i), r.node(i), r.kind(i), hi, lo, i >= n - RECENT ? h.summary(i) : '');
    }
    writer.finish(s, { events: n, digest: n ? r.digest(n - 1) : GENESIS_DIGEST });
  }
}
