/**
 * Classical messages: any node may send to any node; the delay is the shortest fiber path
 * over the fiber speed plus the extra delay, and the noise model's faults apply in order.
 */
import type { Value } from '../expr/types.js';
import { heapPush } from './heap.js';
import { draw } from './links.js';
import type { Net } from './net.js';
import type { Message, SendRecord, World } from './types.js';

/** Lost messages remembered in the world for explanations. */
export const LOST_KEPT = 32;

export interface Outgoing {
  from: string;
  to: string;
  kind: string;
  pair: string | null;
  data: Record<string, Value>;
}

/** Sends a message at time t; returns what happened to it. Infinity delay means no fiber path. */
export function send(net: Net, w: World, msg: Outgoing, t: number): SendRecord {
  const id = ++w.counters.message;
  w.counters.sent++;
  let delay = net.messageDelay(msg.from, msg.to);
  let dropped: string | undefined;
  const faults = net.noise.faults;
  for (let i = 0; i < faults.length; i++) {
    const f = faults[i];
    if (f.from !== undefined && f.from !== msg.from) continue;
    if (f.to !== undefined && f.to !== msg.to) continue;
    if (f.msgKind !== undefined && f.msgKind !== msg.kind) continue;
    const hits = (w.counters.faultHits[i] ?? 0) + 1;
    w.counters.faultHits[i] = hits;
    if (f.kind === 'drop' && hits === f.nth && !dropped) dropped = `fault: drop #${f.nth} ${describe(f)}`;
    if (f.kind === 'delay') delay += f.byNs;
  }
  const loss = net.noise.defaults.classical.loss;
  if (!dropped && loss > 0 && draw(w) < loss) dropped = `lost on the channel (loss ${loss})`;
  const arrives = t + delay;
  if (dropped) {
    w.counters.dropped++;
    const rec: SendRecord = { id, from: msg.from, to: msg.to, kind: msg.kind, pair: msg.pair, sent: t, arrives, dropped };
    w.lost.push(rec);
    if (w.lost.length > LOST_KEPT) w.lost.splice(0, w.lost.length - LOST_KEPT);
    return rec;
  }
  // built key by key: a spread followed by more keys is slow in V8 here (DEVELOPERS.md)
  w.inflight.set(id, { id, from: msg.from, to: msg.to, kind: msg.kind, pair: msg.pair, data: msg.data, sent: t, arrives });
  heapPush(w.queue, { time: arrives, seq: w.seq++, type: 'arrive', message: id });
  return { id, from: msg.from, to: msg.to, kind: msg.kind, pair: msg.pair, sent: t, arrives };
}

function describe(f: { from?: string; to?: string; msgKind?: string }): string {
  return `${f.msgKind ?? 'any kind'} ${f.from ?? 'any'}→${f.to ?? 'any'}`;
}

/** A message reaches its receiver's inbox. */
export function arrive(w: World, id: number): Message {
  const m = w.inflight.get(id)!;
  w.inflight.delete(id);
  w.nodes[m.to].inbox.push(m);
  w.counters.arrived++;
  return m;
}
