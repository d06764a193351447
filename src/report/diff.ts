/**
 * Where two recorded runs part ways (`bellstep diff`, the debugger's `diff`): which inputs
 * differ, the first event at which the recordings differ (on time, site, kind and text, not
 * digests, which differ as soon as seeds do), what the two worlds hold differently just
 * before it, and each run's totals. Both runs are re-run from their inputs, checked event
 * by event against their recordings.
 */
import { deliveredCount, type Engine, type EngineEvent, type World } from '../engine/index.js';
import { formatDuration } from '../model/units.js';
import { sha256, type ReplayFile } from '../session/replay.js';
import { Rerun, type RecordedRun } from './rerun.js';
import { siteOrder } from './site-order.js';

/** Format tag of `diff --json`. */
export const DIFF_FORMAT = 'bellstep/diff@1';

/** The inputs a comparison can find different. */
export type InputName = 'program_set' | 'noise' | 'seed';

/** One side's event at the split. */
export interface DiffEvent {
  time_ns: number;
  node: string;
  kind: string;
  summary: string;
}

/** One run's totals. */
export interface DiffTotals {
  events: number;
  delivered: number;
  stop: string;
}

/** The object `diff --json` prints (docs/format.md0); a side with no event at the split is null. */
export interface DiffReport {
  format: typeof DIFF_FORMAT;
  same: boolean;
  inputs_differ: InputName[];
  first: { index: number; a: DiffEvent | null; b: DiffEvent | null } | null;
  state: { only_a: string[]; only_b: string[] };
  totals: { a: DiffTotals; b: DiffTotals };
}

/** A run to compare: its recording, the hashes of its inputs and how it stopped. */
export interface DiffSide {
  readonly run: RecordedRun;
  readonly inputs: { readonly program_set: string; readonly noise: string | null };
  readonly stop: string;
}

/** A replay file's run as one side of a comparison. */
export function replaySide(run: RecordedRun, r: ReplayFile): DiffSide {
  return { run, inputs: { program_set: r.inputs.program_set.sha256, noise: r.inputs.noise?.sha256 ?? null }, stop: r.stop.reason };
}

/** A run still in memory (the debugger's session) as one side; its inputs are hashed as a replay file would hold them. */
export function engineSide(run: RecordedRun, stop: string): DiffSide {
  const { programSet, noise } = run.engine.net;
  return { run, inputs: { program_set: sha256(programSet.text), noise: noise.file ? sha256(noise.text) : null }, stop };
}

/** An event as two recordings are compared on: time, site, kind and text. */
function keyOf(ev: EngineEvent): string {
  return `${ev.time}\u0000${ev.node}\u0000${ev.type}\u0000${ev.summary}`;
}

function described(ev: EngineEvent | undefined): DiffEvent | null {
  return ev ? { time_ns: ev.time, node: ev.node, kind: ev.type, summary: ev.summary } : null;
}

/**
 * Re-runs both sides side by side, a chunk at a time, and returns the index of the first
 * event at which they differ (the shorter length when one is a prefix of the other), with
 * both sides' events there. Texts are rebuilt by the re-run, since a file keeps only its
 * last events' text.
 */
export function firstSplit(a: RecordedRun, b: RecordedRun): { index: number; a?: EngineEvent; b?: EngineEvent } {
  const ra = new Rerun(a);
  const rb = new Rerun(b);
  const n = Math.min(a.events.length, b.events.length);
  for (let i = 0; i < n; ) {
    const to = Math.min(n, i + 4096);
    const ka: EngineEvent[] = [];
    const kb: EngineEvent[] = [];
    ra.to(to, false, (ev) => void ka.push(ev));
    rb.to(to, false, (ev) => void kb.push(ev));
    for (let j = 0; j < ka.length; j++) if (keyOf(ka[j]) !== keyOf(kb[j])) return { index: i + j, a: ka[j], b: kb[j] };
    i = to;
  }
  // one is a prefix of the other: the longer one's next event is where they part
  const ea: EngineEvent[] = [];
  const eb: EngineEvent[] = [];
  if (a.events.length > n) ra.to(n + 1, false, (ev) => void ea.push(ev));
  if (b.events.length > n) rb.to(n + 1, false, (ev) => void eb.push(ev));
  return { index: n, a: ea[0], b: eb[0] };
}

/** What a world holds, one line per pair half and per message, sites in network order. */
export function holdings(engine: Engine, w: World): string[] {
  const out: string[] = [];
  for (const site of siteOrder(engine.net)) {
    const node = w.nodes[site];
    if (!node) continue;
    for (const p of node.pairs) out.push(`pair ${p.id} at ${site} (stage ${p.stage})`);
    for (const m of node.inbox) out.push(`message ${m.kind} from ${m.from} waiting at ${site}${m.pair ? ` about ${m.pair}` : ''}`);
  }
  const flying = [...w.inflight.values()].sort((x, y) => x.arrives - y.arrives || x.id - y.id);
  for (const m of flying) out.push(`message ${m.kind} ${m.from}→${m.to}${m.pair ? ` about ${m.pair}` : ''} in flight, arriving at ${formatDuration(m.arrives)}`);
  return out;
}

/** The lines of `xs` that `ys` does not hold, counting repeats. */
function without(xs: readonly string[], ys: readonly string[]): string[] {
  const left = new Map<string, number>();
  for (const y of ys) left.set(y, (left.get(y) ?? 0) + 1);
  return xs.filter((x) => {
    const k = left.get(x) ?? 0;
    if (k === 0) return true;
    left.set(x, k - 1);
    return false;
  });
}

/** Re-runs a side to the split (returning what it holds there) and on to its end (returning its deliveries). */
function walk(side: DiffSide, split: number): { held: string[]; delivered: number } {
  const rerun = new Rerun(side.run);
  const held = holdings(side.run.engine, rerun.to(split, false));
  const end = rerun.to(side.run.events.length, false);
  return { held, delivered: deliveredCount(end) };
}

/** Compares two recorded runs. */
export function diffRuns(a: DiffSide, b: DiffSide): DiffReport {
  const ea = a.run.events;
  const eb = b.run.events;
  const inputs_differ: InputName[] = [];
  if (a.inputs.program_set !== b.inputs.program_set) inputs_differ.push('program_set');
  if (a.inputs.noise !== b.inputs.noise) inputs_differ.push('noise');
  if (a.run.seed !== b.run.seed) inputs_differ.push('seed');
  const first = firstSplit(a.run, b.run);
  const split = first.index;
  const same = split === ea.length && split === eb.length;
  const wa = walk(a, split);
  const wb = walk(b, split);
  return {
    format: DIFF_FORMAT,
    same,
    inputs_differ,
    first: same ? null : { index: split, a: described(first.a), b: described(first.b) },
    state: same ? { only_a: [], only_b: [] } : { only_a: without(wa.held, wb.held), only_b: without(wb.held, wa.held) },
    totals: {
      a: { events: ea.length, delivered: wa.delivered, stop: a.stop },
      b: { events: eb.length, delivered: wb.delivered, stop: b.stop },
    },
  };
}
