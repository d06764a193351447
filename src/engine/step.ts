/**
 * Applying events. `applyNext` mutates a draft world by exactly one event; `Engine.step`
 * wraps one event in one immer `produce` (for people stepping), and `Engine.advance`
 * applies a batch of events per `produce` (for headless runs). The same code serves both.
 */
import { Immer } from 'immer';
import type { NoiseModel, ProgramSet } from '../model/types.js';
import { heapPop } from './heap.js';
import { herald, maybeGenerate } from './links.js';
import { arrive } from './messages.js';
import { Net } from './net.js';
import { seedRng } from './rng.js';
import { scanNode } from './scan.js';
import { shortPairId } from './ids.js';
import { settle, thaw, thawNode } from './thaw.js';
import type { EngineEvent, Scheduled, World } from './types.js';

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
    qubits: {},
    clusters: {},
    inflight: {},
    halves: {},
    delivered: null,
    lost: [],
    counters: { qubit: 0, cluster: 0, pair: 0, message: 0, sent: 0, arrived: 0, dropped: 0, faultHits: net.noise.faults.map(() => 0) },
  };
  for (const id of net.nodeIds) w.nodes[id] = { id, busyUntil: 0, nextWake: null, pairs: {}, inbox: [], arrivals: 0, fired: {} };
  for (const [id, info] of net.links) {
    w.links[id] = { id, generating: false, used: { [info.def.ends[0]]: 0, [info.def.ends[1]]: 0 }, generated: 0 };
  }
  for (const id of [...net.links.keys()].sort()) maybeGenerate(net, w, id, 0);
  return w;
}

/** The nodes whose state an event may change: its link's ends, its receiver, or the woken node. */
function touchedBy(net: Net, w: World, s: Scheduled): readonly string[] {
  if (s.type === 'herald') return net.links.get(s.link)!.def.ends;
  if (s.type === 'arrive') return [w.inflight[s.message].to];
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

/** Applies the next event to a mutable (draft) world; null when nothing is left. */
export function applyNext(net: Net, w: World): EngineEvent | null {
  let s: Scheduled | undefined;
  do {
    s = heapPop(w.queue);
    if (!s) return null;
  } while (isStale(w, s));
  w.time = s.time;
  const ev: EngineEvent = { index: w.events++, time: s.time, type: s.type, node: '', nodes: [], summary: '', fires: [], sends: [], deliveries: [], discards: [], delivers: [] };
  let touched: string[];
  let base: string;
  switch (s.type) {
    case 'herald': {
      const info = net.links.get(s.link)!;
      const id = herald(net, w, s.link, s.emitted);
      ev.pair = id;
      touched = info.def.ends[0] === info.def.ends[1] ? [info.def.ends[0]] : [info.def.ends[0], info.def.ends[1]];
      // a fresh pair's state is the link's, with no decay applied yet
      base = `${s.link} made pair ${id} (F ${info.pairFidelity.toFixed(3)})`;
      break;
    }
    case 'arrive': {
      const m = arrive(w, s.message);
      ev.message = s.message;
      touched = [m.to];
      base = `${m.to} got ${m.kind} from ${m.from}${m.pair ? ` about ${shortPairId(m.pair)}` : ''}`;
      break;
    }
    case 'wake': {
      w.nodes[s.node].nextWake = null;
      touched = [s.node];
      base = `${s.node} woke (${s.why})`;
      break;
    }
  }
  ev.node = touched[0];
  for (const n of touched) scanNode(net, w, n, ev);
  // rules fire only at the nodes an event touched, and a link's ends are sorted already
  ev.nodes = touched;
  if (ev.fires.length === 0) ev.summary = base;
  else {
    let fired = '';
    for (const f of ev.fires) fired += `${fired ? ', ' : ''}${f.node}.${f.rule}`;
    ev.summary = `${base}; fired ${fired}`;
  }
  return ev;
}

/** Why a world can go no further: `idle` if nothing is held, `stall` if pairs or messages are stuck. */
export function quiescence(w: World): 'idle' | 'stall' {
  for (const n of Object.values(w.nodes)) {
    if (n.inbox.length > 0 || Object.keys(n.pairs).length > 0) return 'stall';
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
    return this.immer.produce({} as World, () => initialWorld(this.net, seed)) as World;
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
   * Up to `max` events in one `produce`. `before` may refuse the next event (seeing the
   * draft and the next event's time); `after` sees each applied event and may end the batch.
   */
  advance(world: World, max: number, hooks: AdvanceHooks = {}): { world: World; events: EngineEvent[]; exhausted: boolean } {
    const events: EngineEvent[] = [];
    let exhausted = false;
    const batch = (d: World) => {
      while (events.length < max) {
        const t = peekNextTime(d);
        if (t === undefined) {
          exhausted = true;
          break;
        }
        if (hooks.before?.(d, t)) break;
        const ev = applyNext(this.net, d)!;
        events.push(ev);
        if (hooks.after?.(ev, d)) break;
      }
    };
    if (this.mode === 'immer') {
      const next = this.immer.produce(world, batch) as World;
      return { world: events.length ? next : world, events, exhausted };
    }
    // headless: one working copy per batch instead of proxies on every access
    const work = thaw(world);
    batch(work);
    return { world: events.length ? settle(world, work) : world, events, exhausted };
  }
}

export interface AdvanceHooks {
  /** Return true to stop before applying the event due at `nextTime`. */
  before?: (draft: World, nextTime: number) => boolean;
  /** Return true to stop after this event. */
  after?: (ev: EngineEvent, draft: World) => boolean;
}
