/**
 * The static side of a simulation: the program set and noise model with everything the
 * engine derives from them once (link rates and delays, fiber distances, per-node noise).
 * It never changes during a run and is not part of the world.
 */
import type { LinkDef, LinkNoise, NodeNoise, NoiseModel, ProgramSet, Rule } from '../model/types.js';
import type { RuleScope } from './scope.js';
import { bellDiagonal, bitFlipState, fidelityPhiPlus, wernerState, type Rho } from '../quantum/index.js';

export interface LinkInfo {
  readonly def: LinkDef;
  readonly noise: LinkNoise;
  /** Success probability per attempt. */
  readonly pSuccess: number;
  /** Time between attempts (ns). */
  readonly periodNs: number;
  /** From emission to the herald reaching both ends, via the midpoint station (ns). */
  readonly heraldNs: number;
  /** The state of a freshly made pair, ends[0]'s half first. */
  readonly pairRho: Rho;
  /** Its fidelity to Φ+. */
  readonly pairFidelity: number;
  /** That fidelity as event summaries print it (three decimals). */
  readonly fidelityText: string;
  /** The link's distinct ends, sorted: the nodes a herald touches. */
  readonly ends: readonly string[];
}

/** Success probability from fiber loss and detector efficiency (docs/physics.md, "Pair generation"). */
export function derivedSuccess(noise: LinkNoise, lengthM: number): number {
  const s = noise.success;
  if (s.kind === 'fixed') return s.p;
  // each arm is half the link; transmittance 10^(-alpha L / 10) (common practice)
  const armKm = lengthM / 2000;
  const etaArm = Math.pow(10, (-s.fiberLossDbPerKm * armKm) / 10);
  const etaDet = s.detectorEfficiency;
  if (s.scheme === 'double-click') {
    // Barrett & Kok, Phys. Rev. A 71, 060310(R) (2005): p = 1/2 eta_arm^2 eta_det^2
    return 0.5 * etaArm * etaArm * etaDet * etaDet;
  }
  // single-click: p = 2 p_emit eta_arm eta_det (a demo model, docs/physics.md)
  return Math.min(1, 2 * (s.brightState ?? 0) * etaArm * etaDet);
}

function pairState(noise: LinkNoise): Rho {
  const p = noise.pair;
  if (p.kind === 'werner') return wernerState(p.f);
  if (p.kind === 'bit_flip') return bitFlipState(p.f);
  return bellDiagonal(p.coeffs);
}

export class Net {
  readonly programSet: ProgramSet;
  readonly noise: NoiseModel;
  /** Node ids, sorted. */
  readonly nodeIds: readonly string[];
  readonly nodeSet: ReadonlySet<string>;
  readonly links: ReadonlyMap<string, LinkInfo>;
  /** Link ids at each node, sorted. */
  readonly linksAt: ReadonlyMap<string, readonly string[]>;
  readonly rules: ReadonlyMap<string, readonly Rule[]>;
  readonly qubitsAt: ReadonlyMap<string, number>;
  /** Fiber speed (m/s), used for heralds and classical messages alike. */
  readonly speed: number;
  /** Settled shortest distances from each node that has asked (a search stops once its target is settled). */
  private readonly distCache = new Map<string, Map<number, number>>();
  /** Each node's position in `nodeIds`. */
  private readonly index = new Map<string, number>();
  /**
   * The rule interpreter's one reusable expression scope (a cache, not state): nodes are
   * scanned one at a time, so they share it, which keeps a large network's memory small.
   */
  scope: RuleScope | undefined;

  constructor(programSet: ProgramSet, noise: NoiseModel) {
    this.programSet = programSet;
    this.noise = noise;
    this.nodeIds = programSet.nodes.map((n) => n.id).sort();
    this.nodeSet = new Set(this.nodeIds);
    this.nodeIds.forEach((id, i) => this.index.set(id, i));
    this.speed = noise.defaults.classical.speedMPerS;
    this.qubitsAt = new Map(programSet.nodes.map((n) => [n.id, n.qubits]));
    const links = new Map<string, LinkInfo>();
    const at = new Map<string, string[]>(this.nodeIds.map((id) => [id, []]));
    for (const def of programSet.links) {
      const noise = Object.hasOwn(this.noise.links, def.id) ? this.noise.links[def.id] : this.noise.defaults.link;
      const periodNs =
        noise.attemptPeriod === 'fiber' ? Math.round((def.lengthM / this.speed) * 1e9) : noise.attemptPeriod;
      links.set(def.id, {
        def,
        noise,
        pSuccess: derivedSuccess(noise, def.lengthM),
        periodNs,
        heraldNs: Math.round((def.lengthM / 2 / this.speed) * 1e9),
        // frozen: every cluster made by this link starts from it and copies it on first change
        pairRho: Object.freeze(pairState(noise)),
        pairFidelity: fidelityPhiPlus(pairState(noise)),
        fidelityText: fidelityPhiPlus(pairState(noise)).toFixed(3),
        ends: Object.freeze(def.ends[0] === def.ends[1] ? [def.ends[0]] : [def.ends[0], def.ends[1]]),
      });
      at.get(def.ends[0])?.push(def.id);
      at.get(def.ends[1])?.push(def.id);
    }
    for (const list of at.values()) list.sort();
    this.links = links;
    this.linksAt = at;
    this.rules = new Map(this.nodeIds.map((id) => [id, programSet.programs[id]?.rules ?? []]));
  }

  private readonly nodeNoiseCache = new Map<string, NodeNoise>();

  /** Memory and gate noise of a node: its own entry, else the defaults. */
  private readonly ageGuards = new Map<string, boolean>();

  /** Whether any rule of the node has a `have` guard with a timer: min_age, max_age, min_wait or max_wait. */
  hasAgeGuards(node: string): boolean {
    let v = this.ageGuards.get(node);
    if (v === undefined) {
      v = (this.rules.get(node) ?? []).some((r) =>
        r.when.some((g) => g.kind === 'have' && (g.minAgeNs !== undefined || g.maxAgeNs !== undefined || g.minWaitNs !== undefined || g.maxWaitNs !== undefined)),
      );
      this.ageGuards.set(node, v);
    }
    return v;
  }

  private readonly singles = new Map<string, readonly string[]>();

  /** A frozen one-element list of a node, shared, for events that touch one node. */
  nodeList(node: string): readonly string[] {
    let l = this.singles.get(node);
    if (l === undefined) {
      l = Object.freeze([node]);
      this.singles.set(node, l);
    }
    return l;
  }

  nodeNoise(node: string): NodeNoise {
    let n = this.nodeNoiseCache.get(node);
    if (!n) {
      n = Object.hasOwn(this.noise.nodes, node) ? this.noise.nodes[node] : { memory: this.noise.defaults.memory, gates: this.noise.defaults.gates };
      this.nodeNoiseCache.set(node, n);
    }
    return n;
  }

  /**
   * Shortest fiber distance in metres, or Infinity when there is no path. Distances from a
   * node are cached as its searches settle them; a search runs only as far as its target.
   */
  distance(from: string, to: string): number {
    if (from === to) return 0;
    const j = this.index.get(to);
    if (j === undefined) return Infinity;
    let row = this.distCache.get(from);
    if (row === undefined) {
      row = new Map();
      this.distCache.set(from, row);
    }
    let d = row.get(j);
    if (d === undefined) {
      d = this.dijkstra(from, j, row);
      row.set(j, d);
    }
    return d;
  }

  /** Classical delay from one node to another (ns), without faults. */
  messageDelay(from: string, to: string): number {
    const d = this.distance(from, to);
    if (!Number.isFinite(d)) return Infinity;
    return Math.round((d / this.speed) * 1e9) + this.noise.defaults.classical.extraDelayNs;
  }

  /**
   * The distance from `source` to node `target` (an index), in O(E log V) at most: a binary
   * heap ordered by distance, then node id, stopping when the target is settled. Nodes are
   * settled in exactly that order and relaxed in link order, so every sum is formed as it
   * always was, bit for bit. Every node settled on the way is written to `settled`.
   */
  private dijkstra(source: string, target: number, settled: Map<number, number>): number {
    const ids = this.nodeIds;
    const start = this.index.get(source)!;
    const dist = new Map<number, number>([[start, 0]]);
    const done = new Set<number>();
    // entries are (distance, node index); stale ones (a node already settled, or a longer distance) are skipped
    const heapD: number[] = [0];
    const heapN: number[] = [start];
    const before = (a: number, b: number): boolean => heapD[a] < heapD[b] || (heapD[a] === heapD[b] && ids[heapN[a]] < ids[heapN[b]]);
    const swap = (a: number, b: number): void => {
      const d = heapD[a];
      heapD[a] = heapD[b];
      heapD[b] = d;
      const n = heapN[a];
      heapN[a] = heapN[b];
      heapN[b] = n;
    };
    while (heapD.length > 0) {
      const d = heapD[0];
      const u = heapN[0];
      swap(0, heapD.length - 1);
      heapD.pop();
      heapN.pop();
      for (let i = 0; ; ) {
        const l = 2 * i + 1;
        if (l >= heapD.length) break;
        const c = l + 1 < heapD.length && before(l + 1, l) ? l + 1 : l;
        if (!before(c, i)) break;
        swap(c, i);
        i = c;
      }
      if (done.has(u) || d > dist.get(u)!) continue;
      done.add(u);
      settled.set(u, d);
      if (u === target) return d;
      for (const lid of this.linksAt.get(ids[u]) ?? []) {
        const l = this.links.get(lid)!.def;
        const other = this.index.get(l.ends[0] === ids[u] ? l.ends[1] : l.ends[0])!;
        const nd = d + l.lengthM;
        if (nd < (dist.get(other) ?? Infinity)) {
          dist.set(other, nd);
          heapD.push(nd);
          heapN.push(other);
          for (let i = heapD.length - 1; i > 0; ) {
            const p = (i - 1) >> 1;
            if (!before(i, p)) break;
            swap(i, p);
            i = p;
          }
        }
      }
    }
    return Infinity;
  }
}
