/**
 * What a space-time chart shows, gathered by re-running a recorded run: per event, the marks
 * at each site (a pair made, a Bell-state measurement, another measurement, a discard, a
 * delivery, another rule firing) and every message sent, with its send and arrival times.
 */
import type { EngineEvent } from '../engine/index.js';
import { InputError } from '../model/errors.js';
import { Rerun, type RecordedRun } from './rerun.js';
import { siteOrder } from './site-order.js';

/** The kinds of marks, drawn as distinct shapes. */
export type MarkKind = 'pair' | 'swap' | 'measure' | 'discard' | 'deliver' | 'fire';

/** One thing that happened at one site. */
export interface ChartMark {
  readonly kind: MarkKind;
  readonly site: string;
  readonly time: number;
  readonly event: number;
  /** What happened, for the mark's tooltip. */
  readonly note: string;
}

/** One classical message, from its send to its (would-be) arrival. */
export interface ChartMessage {
  readonly from: string;
  readonly to: string;
  readonly kind: string;
  readonly sent: number;
  readonly arrives: number;
  /** The message was dropped by a fault or lost on the channel. */
  readonly lost: boolean;
  /** The event whose rule sent it. */
  readonly event: number;
  readonly pair: string | null;
}

/** A pair made by a link: a tie between its two ends at the herald. */
export interface ChartBond {
  readonly ends: readonly [string, string];
  readonly time: number;
  readonly pair: string;
  readonly event: number;
}

/** Everything the chart of events `from`..`to` of a run draws. */
export interface ChartData {
  readonly title: string;
  readonly seed: number;
  /** Sites in network order: the chart's columns. */
  readonly sites: readonly string[];
  readonly from: number;
  readonly to: number;
  /** Events in the whole recording. */
  readonly total: number;
  readonly marks: readonly ChartMark[];
  readonly messages: readonly ChartMessage[];
  readonly bonds: readonly ChartBond[];
  /** Time of the range's first and last event (ns). */
  readonly start: number;
  readonly end: number;
}

/** The inclusive range of events to draw; out of range or reversed is an input error naming the flag. */
export interface ChartRange {
  readonly from?: number;
  readonly to?: number;
}

/** Checks a range against a recording of `total` events and fills in the ends. */
export function resolveRange(range: ChartRange, total: number, names = { from: '--from', to: '--to' }): { from: number; to: number } {
  if (total === 0) throw new InputError({ code: 'usage', message: 'the run has no events to draw', fix: 'record a run that has at least one event' });
  const from = range.from ?? 0;
  const to = range.to ?? total - 1;
  const last = total - 1;
  for (const [flag, v] of [[names.from, from], [names.to, to]] as const) {
    if (!Number.isSafeInteger(v) || v < 0 || v > last) {
      throw new InputError({ code: 'usage', field: flag, message: `event ${v} is outside the run, which holds events 0 to ${last}`, fix: `give ${flag} a number from 0 to ${last}` });
    }
  }
  if (from > to) {
    throw new InputError({ code: 'usage', field: names.from, message: `the range is reversed: ${names.from} ${from} comes after ${names.to} ${to}`, fix: `give ${names.from} a number no larger than ${names.to}, e.g. ${names.from} ${to} ${names.to} ${from}` });
  }
  return { from, to };
}

/** What one rule firing did, as a mark: the most telling of its actions. */
function fireKind(actions: readonly string[]): MarkKind {
  let measured = false;
  for (const a of actions) {
    if (a.startsWith('Bell-measured')) return 'swap';
    if (a.startsWith('measured ')) measured = true;
  }
  return measured ? 'measure' : 'fire';
}

function gather(ev: EngineEvent, marks: ChartMark[], messages: ChartMessage[], bonds: ChartBond[]): void {
  const at = `event ${ev.index}`;
  if (ev.type === 'herald' && ev.pair !== undefined) {
    const link = ev.pair.slice(0, ev.pair.indexOf('#'));
    const [a, b] = link.split('~');
    bonds.push({ ends: [a, b], time: ev.time, pair: ev.pair, event: ev.index });
    for (const end of [a, b]) marks.push({ kind: 'pair', site: end, time: ev.time, event: ev.index, note: `${at}: ${link} made ${ev.pair}` });
  }
  for (const f of ev.fires) {
    const kind = fireKind(f.actions);
    // discards and deliveries get marks of their own below; a rule that only did those needs no other
    if (kind === 'fire' && f.actions.length > 0 && f.actions.every((a) => a.startsWith('discarded') || a.startsWith('delivered'))) continue;
    const did = f.actions.length ? `: ${f.actions.join('; ')}` : '';
    marks.push({ kind, site: f.node, time: ev.time, event: ev.index, note: `${at}: ${f.node}.${f.rule}${did}` });
  }
  for (const d of ev.discards) marks.push({ kind: 'discard', site: d.node, time: ev.time, event: ev.index, note: `${at}: ${d.node} discarded ${d.pair}` });
  for (const d of ev.delivers) marks.push({ kind: 'deliver', site: d.node, time: ev.time, event: ev.index, note: `${at}: ${d.node} delivered its half of ${d.pair}` });
  for (const s of ev.sends) {
    messages.push({ from: s.from, to: s.to, kind: s.kind, sent: s.sent, arrives: s.arrives, lost: s.dropped !== undefined, event: ev.index, pair: s.pair });
  }
}

/** Re-runs a recorded run up to `range.to`, checking every digest, and gathers the range's marks and messages. */
export function chartData(run: RecordedRun, range: { from: number; to: number }): ChartData {
  const marks: ChartMark[] = [];
  const messages: ChartMessage[] = [];
  const bonds: ChartBond[] = [];
  const rerun = new Rerun(run);
  // the events before the range only need to be reproduced, not described
  rerun.to(range.from, false);
  rerun.to(range.to + 1, true, (ev) => gather(ev, marks, messages, bonds));
  const net = run.engine.net;
  const ps = net.programSet;
  return {
    title: ps.title?.trim() || ps.file,
    seed: run.seed,
    sites: siteOrder(net),
    from: range.from,
    to: range.to,
    total: run.events.length,
    marks,
    messages,
    bonds,
    start: run.events.time(range.from),
    end: run.events.time(range.to),
  };
}
