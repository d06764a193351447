/**
 * The run summary of FORMAT.md §6: exactly its keys, no wall-clock figures and no paths,
 * so the same inputs and seed give a byte-identical summary.
 */
import { deliveries, type Net, type StallEntry, type World } from '../engine/index.js';
import type { Value } from '../expr/types.js';

export type StopReason = 'until' | 'events' | 'idle' | 'stall' | 'breakpoint';

export interface Stop {
  reason: StopReason;
  detail: string;
}

export interface ExpectationResult {
  expr: string;
  ok: boolean;
  /** The expression's value at the end of the run. */
  value: Value;
  /** The values of the parts it compared (`min_fidelity_delivered()` in `min_fidelity_delivered() > 0.8`). */
  saw: { expr: string; value: Value }[];
}

export interface RunSummary {
  format: 'bellstep/run-summary@1';
  seed: number;
  events: number;
  time_ns: number;
  stop: Stop;
  delivered: { id: string; ends: [string, string]; time_ns: number; fidelity: number; bell: [number, number, number, number] }[];
  fired: Record<string, Record<string, number>>;
  messages: { sent: number; delivered: number; dropped: number };
  generated: Record<string, number>;
  expectations: ExpectationResult[];
  stall: Record<string, StallEntry[]> | null;
}

/** Builds the summary of a world at the end of a run. */
export function summarize(
  net: Net,
  w: World,
  seed: number,
  stop: Stop,
  expectations: ExpectationResult[],
  stall: Record<string, StallEntry[]> | null,
): RunSummary {
  const fired: Record<string, Record<string, number>> = {};
  for (const node of net.nodeIds) {
    const rules = net.rules.get(node) ?? [];
    if (rules.length === 0) continue;
    fired[node] = Object.fromEntries(rules.map((r) => [r.name, w.nodes[node].fired[r.name] ?? 0]));
  }
  const generated: Record<string, number> = {};
  for (const id of [...net.links.keys()].sort()) generated[id] = w.links[id].generated;
  return {
    format: 'bellstep/run-summary@1',
    seed,
    events: w.events,
    time_ns: w.time,
    stop,
    delivered: deliveries(w).map((d) => ({ id: d.id, ends: [d.ends[0], d.ends[1]], time_ns: d.time_ns, fidelity: d.fidelity, bell: [d.bell[0], d.bell[1], d.bell[2], d.bell[3]] })),
    fired,
    messages: { sent: w.counters.sent, delivered: w.counters.arrived, dropped: w.counters.dropped },
    generated,
    expectations,
    stall,
  };
}
