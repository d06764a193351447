/**
 * Run statistics (docs/cli.md), added to the run summary as `stats`: delivered pairs per
 * second, the fidelity and latency of delivered pairs, and per link its generation rate
 * and the share of time its slots were full. Rates are per second of simulated time.
 */
import { deliveredCount, eachDelivery, type Net, type World } from '../engine/index.js';
import { mean, nearestRank } from './stats.js';

/** The `stats` object of `run --json`; every figure is null when nothing qualifies (no time passed, nothing delivered). */
export interface RunStats {
  delivered_per_second: number | null;
  fidelity: { mean: number | null; min: number | null; p5: number | null; p50: number | null; p95: number | null };
  /** From the birth (herald) of the earliest link pair that went into a delivered pair, to its delivery. */
  latency_ns: { mean: number | null; p50: number | null; p95: number | null; max: number | null };
  links: Record<string, { generated_per_second: number | null; slots_full_share: number | null }>;
}

/** What the statistics are computed from: plain numbers, so a worked example can be checked by hand. */
export interface StatsInput {
  readonly timeNs: number;
  /** Fidelity of each delivered pair. */
  readonly fidelities: ArrayLike<number>;
  /** Latency of each delivered pair (ns): delivery time less the birth of its earliest link pair. */
  readonly latencies: ArrayLike<number>;
  /** Per link, sorted by id: pairs made and the time its slots were full (ns). */
  readonly links: readonly { readonly id: string; readonly generated: number; readonly fullNs: number }[];
}

/** An ascending copy, in a typed array: eight bytes a value however many pairs a run delivers. */
function sorted(values: ArrayLike<number>): Float64Array {
  return Float64Array.from(values).sort();
}

/** The statistics of a run from its figures. */
export function statsFrom(input: StatsInput): RunStats {
  const seconds = input.timeNs / 1e9;
  const rate = (count: number) => (seconds > 0 ? count / seconds : null);
  const fs = sorted(input.fidelities);
  const ls = sorted(input.latencies);
  const links: RunStats['links'] = {};
  for (const l of input.links) {
    links[l.id] = { generated_per_second: rate(l.generated), slots_full_share: input.timeNs > 0 ? Math.min(1, Math.max(0, l.fullNs / input.timeNs)) : null };
  }
  return {
    delivered_per_second: rate(fs.length),
    fidelity: { mean: mean(input.fidelities) ?? null, min: fs.length ? fs[0] : null, p5: nearestRank(fs, 5) ?? null, p50: nearestRank(fs, 50) ?? null, p95: nearestRank(fs, 95) ?? null },
    latency_ns: { mean: mean(input.latencies) ?? null, p50: nearestRank(ls, 50) ?? null, p95: nearestRank(ls, 95) ?? null, max: ls.length ? ls[ls.length - 1] : null },
    links,
  };
}

/** The statistics of a run that ended in world `w`; delivery records are read one at a time. */
export function runStats(net: Net, w: World): RunStats {
  const links = [...net.links.keys()].sort().map((id) => {
    const l = w.links[id];
    // a link still full at the end has been so since `fullSince`
    const open = l.fullSince >= 0 && w.time > l.fullSince ? w.time - l.fullSince : 0;
    return { id, generated: l.generated, fullNs: l.fullNs + open };
  });
  const n = deliveredCount(w);
  const fidelities = new Float64Array(n);
  const latencies = new Float64Array(n);
  let k = 0;
  for (const d of eachDelivery(w)) {
    fidelities[k] = d.fidelity;
    latencies[k++] = d.time_ns - d.born_ns;
  }
  return statsFrom({ timeNs: w.time, fidelities, latencies, links });
}
