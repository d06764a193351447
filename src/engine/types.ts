/**
 * The world: everything that changes while a network runs, as one plain value. Worlds
 * handed out by the engine are frozen (immer); the engine's own code mutates drafts of
 * them. Density matrices (Float64Array) are never mutated once stored: copy on write.
 */
import type { Value } from '../expr/types.js';
import type { Rho } from '../quantum/index.js';
import type { DeliveredView } from './delivered.js';

/** xoroshiro128+ state (pure-rand), kept inside the world so runs are reproducible. */
export type RngState = [number, number, number, number];

/** Something scheduled to happen; the queue is a binary heap ordered by (time, seq). */
export type Scheduled =
  | { readonly time: number; readonly seq: number; readonly type: 'herald'; readonly link: string; readonly emitted: number }
  | { readonly time: number; readonly seq: number; readonly type: 'arrive'; readonly message: number }
  | { readonly time: number; readonly seq: number; readonly type: 'wake'; readonly node: string; readonly why: string };

/** One half of a pair as recorded by the node that holds it. */
export interface PairRecord {
  /** The local qubit holding this half (its number; shown as `q12`). */
  qubit: number;
  /** Shared pair id, e.g. `mill~quay#12`. */
  id: string;
  partner: string;
  stage: string;
  /** Time the half arrived at this node (ns); age is measured from here. */
  born: number;
  /**
   * Time the half entered its current stage at this node (ns): its arrival, then each
   * `stage` step. `min_wait`, `max_wait` and `waited()` measure from here. Not part of digests.
   */
  entered: number;
  /** Arrival order at this node, for `pick` ties. */
  order: number;
  /** The link whose slot the half occupies. */
  link: string;
  /** Values stored by `note` steps. */
  notes: Record<string, Value>;
}

export interface QubitState {
  /** The qubit's number (shown as `q12`); numbers are never reused within a run. */
  id: number;
  node: string;
  /** The link whose slot this qubit occupies. */
  link: string;
  /** The number of the cluster holding it. */
  cluster: number;
  /** Memory decay has been applied up to this time (ns). */
  decayedTo: number;
  /** Delivered halves no longer decay. */
  frozen: boolean;
}

/** A set of qubits that may be entangled with each other, with their joint state. */
export interface Cluster {
  /** The cluster's number (shown as `c7`). */
  id: number;
  /** Qubit numbers in the order of the density matrix's qubits. */
  qubits: number[];
  rho: Rho;
  /**
   * The herald time of the earliest link pair that went into this cluster (ns): the minimum
   * over the clusters merged into it, so a pair made by swaps and purification knows when
   * its oldest ingredient was born. Not part of digests.
   */
  born: number;
}

export interface Message {
  /** The message's number (shown as `m5`). */
  id: number;
  from: string;
  to: string;
  kind: string;
  pair: string | null;
  data: Record<string, Value>;
  sent: number;
  arrives: number;
}

export interface NodeState {
  id: string;
  /** Operations of the last rule body run until this time; rules wait until then. */
  busyUntil: number;
  /** The pending wake-up, if any (ns). */
  nextWake: number | null;
  /** Held halves in arrival order (the oldest first). */
  pairs: PairRecord[];
  /** Arrived, unconsumed messages, oldest first. */
  inbox: Message[];
  /** Arrivals so far, for the arrival order of halves. */
  arrivals: number;
  /** Times each rule of this node has fired (kept per node so a fire copies only this node). */
  fired: Record<string, number>;
}

export interface LinkState {
  id: string;
  /** A pair is being attempted (one herald is scheduled). */
  generating: boolean;
  /** Slots in use at each end. */
  used: Record<string, number>;
  /** Pairs made so far. */
  generated: number;
  /** Since when the link cannot attempt because an end has no free slot (ns); -1 while it can. */
  fullSince: number;
  /** Time spent so full, up to `fullSince` (ns). Neither field is part of digests. */
  fullNs: number;
}

/** The true state of a pair whose two halves were both delivered (docs/physics.md, "Delivery"). */
export interface DeliveryRecord {
  id: string;
  ends: [string, string];
  time_ns: number;
  fidelity: number;
  bell: [number, number, number, number];
  /** The herald time of the earliest link pair that went into this pair (ns), for latency. */
  born_ns: number;
}

export interface HalfDelivery {
  node: string;
  qubit: number;
  time: number;
}

export interface Counters {
  qubit: number;
  cluster: number;
  pair: number;
  message: number;
  sent: number;
  arrived: number;
  dropped: number;
  /** Matches so far of each fault in the noise model, by index. */
  faultHits: number[];
}

export interface World {
  /** Simulated time, integer nanoseconds. */
  time: number;
  /** Events applied so far; the next event gets this index. */
  events: number;
  /** Next scheduling sequence number (breaks ties in the queue). */
  seq: number;
  rng: RngState;
  queue: Scheduled[];
  nodes: Record<string, NodeState>;
  links: Record<string, LinkState>;
  /** Qubits in use, by number (a Map: numbers as property keys make iteration slow in V8). */
  qubits: Map<number, QubitState>;
  /** Clusters, by number. */
  clusters: Map<number, Cluster>;
  /** Messages on their way, by number, in the order they were sent. */
  inflight: Map<number, Message>;
  halves: Record<string, HalfDelivery>;
  /** Delivered pairs: this world's view of the run's append-only delivery log (see delivered.ts). */
  delivered: DeliveredView | null;
  /** The most recent lost messages (at most LOST_KEPT), for explanations. */
  lost: SendRecord[];
  counters: Counters;
}

/** What one rule firing did, for the event log and the narration. */
export interface FireRecord {
  node: string;
  rule: string;
  /** Bound names and what they named (pair ids, message summaries). */
  bound: Record<string, string>;
  /** Short plain phrases, in order, e.g. "measured mill~quay#4 in z: 1". */
  actions: string[];
  /** Lines written by `log` steps. */
  log: string[];
}

export interface SendRecord {
  id: number;
  from: string;
  to: string;
  kind: string;
  pair: string | null;
  sent: number;
  arrives: number;
  /** Why the message was lost, if it was. */
  dropped?: string;
}

/** One applied event, as shown in logs, panes and replay files. */
export interface EngineEvent {
  index: number;
  time: number;
  type: 'herald' | 'arrive' | 'wake';
  /** The main node of the event (for a herald, the link's first end). */
  node: string;
  /** Every node whose state the event changed or whose rules were tried. */
  nodes: string[];
  /** One plain line. */
  summary: string;
  fires: FireRecord[];
  sends: SendRecord[];
  deliveries: DeliveryRecord[];
  discards: { node: string; pair: string }[];
  /** Halves handed to the application by `deliver` steps. */
  delivers: { node: string; pair: string }[];
  /** Pair id made by a herald. */
  pair?: string;
  /** Number of the message delivered by an arrival. */
  message?: number;
}
