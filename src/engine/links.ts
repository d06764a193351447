/**
 * Heralded pair generation. A link attempts while both ends have a free slot for it; the
 * number of attempts until success is drawn from the geometric distribution, so there is
 * one event per success, not per attempt.
 */
import { linkPairId } from './ids.js';
import { addCluster } from './qubits.js';
import { heapPush } from './heap.js';
import { drawInPlace, geometricAttempts } from './rng.js';
import type { Net } from './net.js';
import type { World } from './types.js';
import type { Value } from '../expr/types.js';

/** Draws one uniform number from the world's generator. */
export function draw(w: World): number {
  return drawInPlace(w.rng);
}

export function freeSlots(net: Net, w: World, link: string, node: string): number {
  return net.links.get(link)!.def.slots - w.links[link].used[node];
}

/**
 * Starts attempts on a link at time t if it is idle and both ends have a free slot. A link
 * that cannot for want of a slot notes since when, and adds the time to `fullNs` once it
 * can again (the run statistics' `slots_full_share`).
 */
export function maybeGenerate(net: Net, w: World, link: string, t: number): void {
  const info = net.links.get(link)!;
  const state = w.links[link];
  if (state.generating || info.pSuccess <= 0) return;
  const [a, b] = info.def.ends;
  if (freeSlots(net, w, link, a) <= 0 || freeSlots(net, w, link, b) <= 0) {
    if (state.fullSince < 0) state.fullSince = t;
    return;
  }
  if (state.fullSince >= 0) {
    // a slot freed by an operation that ends later than the event still counts from its end
    if (t > state.fullSince) state.fullNs += t - state.fullSince;
    state.fullSince = -1;
  }
  const k = geometricAttempts(info.pSuccess, draw(w));
  if (!Number.isFinite(k)) return;
  const emitted = t + (k - 1) * info.periodNs;
  state.generating = true;
  heapPush(w.queue, { time: emitted + info.heraldNs, seq: w.seq++, type: 'herald', link, emitted });
}

/** The notes of a fresh pair: none, shared until a `note` step writes its own (fire.ts). */
const NO_NOTES: Record<string, Value> = Object.freeze({}) as Record<string, Value>;

/** The herald has reached both ends: the pair exists at both. Returns the new pair id. */
export function herald(net: Net, w: World, link: string, emitted: number): string {
  const info = net.links.get(link)!;
  const [a, b] = info.def.ends;
  const [qa, qb] = addCluster(w, [{ node: a, link }, { node: b, link }], info.pairRho, emitted);
  const id = linkPairId(link, ++w.counters.pair);
  const na = w.nodes[a];
  na.pairs.push({ qubit: qa, id, partner: b, stage: 'link', born: w.time, entered: w.time, order: na.arrivals++, link, notes: NO_NOTES });
  w.links[link].used[a]++;
  const nb = w.nodes[b];
  nb.pairs.push({ qubit: qb, id, partner: a, stage: 'link', born: w.time, entered: w.time, order: nb.arrivals++, link, notes: NO_NOTES });
  w.links[link].used[b]++;
  w.links[link].generating = false;
  w.links[link].generated++;
  maybeGenerate(net, w, link, w.time);
  return id;
}

/** A half left its slot (measured, discarded or delivered): the link may attempt again. */
export function releaseSlot(net: Net, w: World, link: string, node: string, t: number): void {
  w.links[link].used[node]--;
  maybeGenerate(net, w, link, t);
}
