/**
 * The run summary of docs/cli.md: exactly its keys, no wall-clock figures and no paths,
 * so the same inputs and seed give a byte-identical summary.
 */
import { deliveries, eachDelivery, type DeliveryRecord, type Net, type StallEntry, type World } from '../engine/index.js';
import type { Value } from '../expr/types.js';

export type StopReason = 'until' | 'events' | 'idle' | 'stall' | 'breakpoint' | 'crash';

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
  const s = summaryHead(net, w, seed, stop, expectations, stall);
  s.delivered = deliveries(w).map(deliveredEntry);
  return s;
}

/** A delivery record as the summary lists it. */
function deliveredEntry(d: DeliveryRecord): RunSummary['delivered'][number] {
  return { id: d.id, ends: [d.ends[0], d.ends[1]], time_ns: d.time_ns, fidelity: d.fidelity, bell: [d.bell[0], d.bell[1], d.bell[2], d.bell[3]] };
}

/**
 * The summary with an empty `delivered` list: everything but the delivery records, which a
 * long run may hold by the hundred thousand (see `writeSummaryJson`).
 */
export function summaryHead(
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
    delivered: [],
    fired,
    messages: { sent: w.counters.sent, delivered: w.counters.arrived, dropped: w.counters.dropped },
    generated,
    expectations,
    stall,
  };
}

/** Output is handed on in pieces of about this many characters. */
const CHUNK = 1 << 16;

/**
 * Writes the summary as JSON, exactly the bytes of `JSON.stringify(summary, null, 2)` and a
 * newline, where `head` is the summary without its records (`summaryHead`) and the records
 * are read from the world one at a time: memory stays flat however many pairs were delivered.
 */
export function writeSummaryJson(head: RunSummary, w: World, write: (chunk: string) => void): void {
  const text = JSON.stringify(head, null, 2);
  // the one top-level key at two spaces' indent; a string value could not hold bare quotes
  const marker = '\n  "delivered": []';
  const at = text.indexOf(marker);
  if (head.delivered.length > 0 || at < 0) throw new Error('writeSummaryJson needs a summary head (an empty delivered list)');
  let out = text.slice(0, at) + '\n  "delivered": [';
  let first = true;
  for (const d of eachDelivery(w)) {
    out += `${first ? '' : ','}\n    ${JSON.stringify(deliveredEntry(d), null, 2).replace(/\n/g, '\n    ')}`;
    first = false;
    if (out.length >= CHUNK) {
      write(out);
      out = '';
    }
  }
  out += first ? ']' : '\n  ]';
  write(out + text.slice(at + marker.length) + '\n');
}
