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
import { buildReplay, serializeReplay } from './replay.js';
import type { Stop } from './summary.js';

/** Why a continue, reverse-continue or jump ended. */
export interface SessionStop {
  readonly reason: 'breakpoint' | 'stall' | 'idle' | 'start' | 'limit' | 'event' | 'time';
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

  constructor(
    readonly engine: Engine,
    opts: SessionOptions = {},
  ) {
    this.history = new History(engine, opts.seed ?? engine.net.noise.seed, opts);
    this.continueLimit = opts.continueLimit ?? 1_000_000;
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
    const target = Math.max(0, Math.floor(n));
    if (target > this.history.frontier) this.extendTo(target);
    this.cursorAt = Math.min(target, this.history.frontier);
    this.history.place(this.cursorAt);
    this.lastStop =
      this.cursorAt < target
        ? { reason: this.ending() ?? 'idle', detail: `the run ends after ${plural(this.cursorAt, 'event')}` }
        : { reason: 'event', detail: 'went to this event' };
    return this.lastStop;
  }

  /** Places the cursor after the last event at or before simulated time t (ns). */
  gotoTime(t: number): SessionStop {
    const recs = this.history.records;
    if (recs.length === 0 || recs[recs.length - 1].time_ns <= t) {
      this.history.extend(Number.MAX_SAFE_INTEGER, undefined, (next) => next > t);
    }
    // binary search: the number of events with time <= t
    let lo = 0;
    let hi = recs.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (recs[mid].time_ns <= t) lo = mid + 1;
      else hi = mid;
    }
    this.cursorAt = lo;
    this.history.place(lo);
    this.lastStop = { reason: 'time', detail: `at the last event up to the time asked for (${plural(lo, 'event')})` };
    return this.lastStop;
  }

  private extendTo(n: number): void {
    this.history.extend(n - this.history.frontier);
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
    const active = this.bps.filter((b) => b.enabled);
    const start = this.cursorAt;
    const scan = breakpointScanner(this.engine.net, active, this.world());
    const found: { hit?: Hit & { at: number } } = {};
    const onEvent = (ev: EngineEvent, w: World): boolean => {
      const h = scan(ev, w);
      if (h) found.hit = { at: ev.index + 1, ...h };
      return h !== undefined;
    };
    // events already computed: replay them from the cursor in one batch
    let w = this.world();
    let at = start;
    while (!found.hit && at < this.history.frontier) {
      const r = this.engine.advance(w, Math.min(4096, this.history.frontier - at), { after: (ev, d) => onEvent(ev, d) });
      w = r.world;
      at += r.events.length;
      if (r.events.length === 0) break;
    }
    if (!found.hit && at >= this.history.frontier) {
      this.history.extend(this.continueLimit - (at - start), (ev, d) => onEvent(ev, d));
    }
    const hit = found.hit as (Hit & { at: number }) | undefined;
    if (!hit) at = Math.max(at, this.history.frontier);
    if (hit) {
      this.hitEvents.get(hit.bp.id)?.add(hit.at - 1);
      this.cursorAt = hit.at;
      this.history.place(hit.at);
      this.lastStop = { reason: 'breakpoint', detail: `breakpoint ${hit.bp.id}: ${hit.what}`, breakpoint: hit.bp.id };
      return this.lastStop;
    }
    this.cursorAt = at;
    this.history.place(at);
    const end = this.ending();
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
    const active = this.bps.filter((b) => b.enabled && b.kind !== 'stall');
    const chunk = Math.max(256, this.history.keyframeInterval);
    // a hit "at n" means the event that led to world n hit; look for the last one with n < cursor
    let hiAt = this.cursorAt - 1;
    while (hiAt > 0 && active.length > 0) {
      const from = Math.max(0, hiAt - chunk);
      const scan = breakpointScanner(this.engine.net, active, this.history.worldAt(from));
      const found: { last?: Hit & { at: number } } = {};
      this.engine.advance(this.history.worldAt(from), hiAt - from, {
        after: (ev, d) => {
          const h = scan(ev, d);
          if (h) found.last = { at: ev.index + 1, ...h };
          return false;
        },
      });
      const last = found.last;
      if (last) {
        this.hitEvents.get(last.bp.id)?.add(last.at - 1);
        this.cursorAt = last.at;
        this.history.place(last.at);
        this.lastStop = { reason: 'breakpoint', detail: `breakpoint ${last.bp.id}: ${last.what}`, breakpoint: last.bp.id };
        return this.lastStop;
      }
      hiAt = from;
    }
    this.cursorAt = 0;
    this.history.place(0);
    this.lastStop = { reason: 'start', detail: 'no earlier breakpoint hit; nothing has happened yet' };
    return this.lastStop;
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

  /** The replay file of everything computed so far. */
  exportReplay(stop?: Stop): string {
    const { programSet, noise } = this.engine.net;
    const s: Stop = stop ?? { reason: 'events', detail: `exported from the debugger at event ${this.cursorAt}` };
    return serializeReplay(
      buildReplay(programSet, noise, { seed: this.seed, breakpoints: this.bps.map((b) => b.spec), expectations: [] }, s, [...this.history.records]),
    );
  }
}
