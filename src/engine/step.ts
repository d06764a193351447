/**
 * Applying events. `applyNext` mutates a draft world by exactly one event; `Engine.step`
 * wraps one event in one immer `produce` (for people stepping), and `Engine.advance`
 * applies a batch of events per `produce` (for headless runs). The same code serves both.
 */
import { enableMapSet, Immer } from 'immer';

import type { NoiseModel, ProgramSet } from '../model/types.js';
import { heapPop } from './heap.js';
import { herald, maybeGenerate } from './links.js';
import { arrive } from './messages.js';
import { Net } from './net.js';
import { seedRng } from './rng.js';
import { scanNode } from './scan.js';
import { shortPairId } from './ids.js';
import { deepFreeze, settle, thaw, thawNode } from './thaw.js';
import type { DeliveryRecord, EngineEvent, FireRecord, Message, Scheduled, SendRecord, World } from './types.js';

// worlds keep qubits, clusters and messages in Maps; immer drafts them with this plugin
enableMapSet();

/** The world before any event: empty memories, every link attempting. */
export function initialWorld(net: Net, seed: number): World {
  const w: World = {
    time: 0,
    events: 0,
    seq: 0,
    rng: seedRng(seed),
    queue: [],
    nodes: {},
    links: {},
    qubits: new Map(),
    clusters: new Map(),
    inflight: new Map(),
    halves: {},
    delivered: null,
    lost: [],
    counters: { qubit: 0, cluster: 0, pair: 0, message: 0, sent: 0, arrived: 0, dropped: 0, faultHits: net.noise.faults.map(() => 0) },
  };
  for (const id of net.nodeIds) w.nodes[id] = { id, busyUntil: 0, nextWake: null, pairs: [], inbox: [], arrivals: 0, fired: {} };
  for (const [id, info] of net.links) {
    w.links[id] = { id, generating: false, used: { [info.def.ends[0]]: 0, [info.def.ends[1]]: 0 }, generated: 0, fullSince: -1, fullNs: 0 };
  }
  for (const id of [...net.links.keys()].sort()) maybeGenerate(net, w, id, 0);
  return w;
}

/** The nodes whose state an event may change: its link's ends, its receiver, or the woken node. */
function touchedBy(net: Net, w: World, s: Scheduled): readonly string[] {
  if (s.type === 'herald') return net.links.get(s.link)!.ends;
  if (s.type === 'arrive') return [w.inflight.get(s.message)!.to];
  return [s.node];
}

function isStale(w: World, s: Scheduled): boolean {
  return s.type === 'wake' && w.nodes[s.node].nextWake !== s.time;
}

/** Whether any event is left to apply. */
export function hasNext(w: World): boolean {
  return w.queue.some((s) => !isStale(w, s));
}

/** Time of the next event on a mutable (draft) world, dropping stale wake-ups from the top of the queue. */
export function peekNextTime(w: World): number | undefined {
  while (w.queue.length > 0 && isStale(w, w.queue[0])) heapPop(w.queue);
  return w.queue[0]?.time;
}

const NONE: readonly never[] = Object.freeze([]);

/**
 * An applied event. Its one-line summary is built when first read: headless runs that only
 * count events never pay for the text.
 */
class AppliedEvent implements EngineEvent {
  node = '';
  nodes: string[] = NONE as never;
  fires: FireRecord[] = NONE as never;
  sends: SendRecord[] = NONE as never;
  deliveries: DeliveryRecord[] = NONE as never;
  discards: { node: string; pair: string }[] = NONE as never;
  delivers: { node: string; pair: string }[] = NONE as never;
  pair?: string = undefined;
  message?: number = undefined;
  /** What the summary's first half is built from: the scheduled entry, and the message of an arrival. */
  private readonly from: Scheduled;
  msg: Message | undefined = undefined;
  fidelityText = '';
  private text: string | undefined = undefined;

  constructor(
    readonly index: number,
    from: Scheduled,
  ) {
    this.from = from;
  }

  get time(): number {
    return this.from.time;
  }

  get type(): EngineEvent['type'] {
    return this.from.type;
  }

  get summary(): string {
    if (this.text === undefined) this.text = summaryOf(this, this.from);
    return this.text;
  }

  /** The plain shape of `EngineEvent`, so that a serialised event reads like any other. */
  toJSON(): EngineEvent {
    const { index, time, type, node, nodes, summary, fires, sends, deliveries, discards, delivers, pair, message } = this;
    return { index, time, type, node, nodes, summary, fires, sends, deliveries, discards, delivers, pair, message };
  }
}

function summaryOf(ev: AppliedEvent, s: Scheduled): string {
  let base: string;
  if (s.type === 'herald') base = `${s.link} made pair ${ev.pair} (F ${ev.fidelityText})`;
  else if (s.type === 'arrive') {
    const m = ev.msg!;
    base = `${ev.node} got ${m.kind} from ${m.from}${m.pair ? ` about ${shortPairId(m.pair)}` : ''}`;
  } else base = `${ev.node} woke (${s.why})`;
  if (ev.fires.length === 0) return base;
  let fired = '';
  for (const f of ev.fires) fired += `${fired ? ', ' : ''}${f.node}.${f.rule}`;
  return `${base}; fired ${fired}`;
}

/**
 * Applies the next event to a mutable (draft) world; null when nothing is left. With
 * `detail` off, rule firings record only which rule fired (no action phrases or bound
 * names): what headless runs, breakpoints and digests need, at a fraction of the cost.
 */
export function applyNext(net: Net, w: World, detail = true): EngineEvent | null {
  let s: Scheduled | undefined;
  do {
    s = heapPop(w.queue);
    if (!s) return null;
  } while (isStale(w, s));
  w.time = s.time;
  const ev = new AppliedEvent(w.events++, s);
  let touched: readonly string[];
  switch (s.type) {
    case 'herald': {
      const info = net.links.get(s.link)!;
      ev.pair = herald(net, w, s.link, s.emitted);
      touched = info.ends;
      // a fresh pair's state is the link's, with no decay applied yet
      ev.fidelityText = info.fidelityText;
      break;
    }
    case 'arrive': {
      const m = arrive(w, s.message);
      ev.message = s.message;
      ev.msg = m;
      touched = net.nodeList(m.to);
      break;
    }
    case 'wake': {
      w.nodes[s.node].nextWake = null;
      touched = net.nodeList(s.node);
      break;
    }
  }
  ev.node = touched[0];
  for (let i = 0; i < touched.length; i++) scanNode(net, w, touched[i], ev, detail);
  // rules fire only at the nodes an event touched, and a link's ends are sorted already
  ev.nodes = touched as string[];
  return ev;
}

/** Why a world can go no further: `idle` if nothing is held, `stall` if pairs or messages are stuck. */
export function quiescence(w: World): 'idle' | 'stall' {
  for (const n of Object.values(w.nodes)) {
    if (n.inbox.length > 0 || n.pairs.length > 0) return 'stall';
  }
  return 'idle';
}

/** A simulation of one program set under one noise model. Worlds it returns are frozen values. */
export class Engine {
  readonly net: Net;
  private readonly immer = new Immer({ autoFreeze: true });

  /**
   * How events are applied: `copy` (a mutable working copy, then shared with the world it
   * came from and frozen; the default, several times faster) or `immer` (a draft per step or
   * batch). Both give equal worlds with the same structural sharing; tests check it.
   */
  mode: 'copy' | 'immer' = 'copy';

  constructor(programSet: ProgramSet, noise: NoiseModel) {
    this.net = new Net(programSet, noise);
  }

  /** The world at time 0 for a seed (the noise model's seed by default). */
  initial(seed: number = this.net.noise.seed): World {
    if (this.mode === 'immer') return this.immer.produce({} as World, () => initialWorld(this.net, seed)) as World;
    // frozen as every world the copy mode makes (immer's own freeze costs several times more on a large network)
    return deepFreeze(initialWorld(this.net, seed));
  }

  /** One event: the next world and what happened, or the same world and null when nothing is left. */
  step(world: World): { world: World; event: EngineEvent | null } {
    if (this.mode === 'immer') {
      let event: EngineEvent | null = null;
      const next = this.immer.produce(world, (d: World) => {
        event = applyNext(this.net, d);
      }) as World;
      return { world: event ? next : world, event };
    }
    // a working copy, then structural sharing with the world it came from (see thaw.ts);
    // only the nodes the next event touches are copied
    const work = thaw(world, { nodes: 'none' });
    const t = peekNextTime(work);
    if (t === undefined) return { world, event: null };
    for (const n of touchedBy(this.net, work, work.queue[0])) thawNode(work, n);
    const event = applyNext(this.net, work);
    return { world: event ? settle(world, work) : world, event };
  }

  /**
   * Up to `max` events on one working copy (one `produce` under immer). `before` may refuse
   * the next event (seeing the draft and the next event's time); `after` sees each applied
   * event and may end the run. `keep` says which events to return (all by default; `last`
   * or `none` keep nothing else alive); `detail: false` records only which rules fired.
   */
  advance(world: World, max: number, hooks: AdvanceHooks = {}, opts: AdvanceOptions = {}): AdvanceResult {
    const keep = opts.keep ?? 'all';
    const detail = opts.detail ?? true;
    const events: EngineEvent[] = [];
    let count = 0;
    let exhausted = false;
    const net = this.net;
    const { before, after } = hooks;
    const batch = (d: World) => {
      while (count < max) {
        const t = peekNextTime(d);
        if (t === undefined) {
          exhausted = true;
          break;
        }
        if (before !== undefined && before(d, t)) break;
        const ev = applyNext(net, d, detail)!;
        count++;
        if (keep === 'all') events.push(ev);
        else if (keep === 'last') events[0] = ev;
        if (after !== undefined && after(ev, d)) break;
      }
    };
    if (this.mode === 'immer') {
      const next = this.immer.produce(world, batch) as World;
      return { world: count ? next : world, events, count, exhausted };
    }
    // one working copy for the whole call instead of proxies on every access
    const work = thaw(world);
    batch(work);
    return { world: count ? settle(world, work) : world, events, count, exhausted };
  }
}

export interface AdvanceHooks {
  /** Return true to stop before applying the event due at `nextTime`. */
  before?: (draft: World, nextTime: number) => boolean;
  /** Return true to stop after this event. */
  after?: (ev: EngineEvent, draft: World) => boolean;
}

export interface AdvanceOptions {
  /** Which applied events to return: every one (default), only the last, or none. */
  readonly keep?: 'all' | 'last' | 'none';
  /** Whether rule firings record their action phrases and bound names (default true). */
  readonly detail?: boolean;
}

export interface AdvanceResult {
  readonly world: World;
  /** The events kept (see `AdvanceOptions.keep`). */
  readonly events: EngineEvent[];
  /** Events applied. */
  readonly count: number;
  /** True when the queue ran dry. */
  readonly exhausted: boolean;
}
