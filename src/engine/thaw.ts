/**
 * A mutable working copy of a frozen world, for headless batches that skip immer's
 * proxies. Only what the engine mutates is copied; values it only replaces (density
 * matrices, queue entries, messages, delivery records) are shared, which is safe because
 * they are never mutated once stored.
 */
import { freeze } from 'immer';
import type { World } from './types.js';

function mapValues<T, U>(o: Record<string, T>, f: (v: T) => U): Record<string, U> {
  const out: Record<string, U> = {};
  for (const k in o) out[k] = f(o[k]);
  return out;
}

/** A deep-enough copy of a world that the engine can mutate in place. */
export function thaw(w: World): World {
  return {
    time: w.time,
    events: w.events,
    seq: w.seq,
    rng: [w.rng[0], w.rng[1], w.rng[2], w.rng[3]],
    queue: w.queue.slice(),
    nodes: mapValues(w.nodes, (n) => ({
      id: n.id,
      busyUntil: n.busyUntil,
      nextWake: n.nextWake,
      pairs: mapValues(n.pairs, (p) => ({ ...p, notes: { ...p.notes } })),
      inbox: n.inbox.slice(),
      arrivals: n.arrivals,
      fired: { ...n.fired },
    })),
    links: mapValues(w.links, (l) => ({ id: l.id, generating: l.generating, used: { ...l.used }, generated: l.generated })),
    qubits: mapValues(w.qubits, (q) => ({ ...q })),
    clusters: mapValues(w.clusters, (c) => ({ id: c.id, qubits: c.qubits, rho: c.rho })),
    inflight: { ...w.inflight },
    halves: { ...w.halves },
    delivered: w.delivered,
    lost: w.lost.slice(),
    counters: { ...w.counters, faultHits: w.counters.faultHits.slice() },
  };
}

/** Freezes a world worked on in place, so it can be handed out as a value. */
export function refreeze(w: World): World {
  return freeze(w, true);
}
