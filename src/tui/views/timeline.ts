/**
 * The timeline pane: a space-time chart of the recent past, sites as columns and time going
 * down, one row per event up to the cursor. Messages are slanted lines from sender to
 * receiver, placed by their send and arrival times; marks show new pairs, swaps,
 * purification steps, deliveries and discards. Only the visible rows and columns are built.
 */
import type { EngineEvent, FireRecord, Net, World } from '../../engine/index.js';
import { formatDuration } from '../../model/units.js';
import type { EventLog } from '../event-log.js';
import type { Line, RecordList, Seg, Tone } from '../lines.js';
import { fit, padLeft } from '../text.js';
import { chainOrder } from './network.js';

/** The marks of the chart, for the pane's legend and the help overlay. */
export const TIMELINE_MARKS: readonly { mark: string; meaning: string; tone: Tone }[] = [
  { mark: '+', meaning: 'new pair (both ends)', tone: 'good' },
  { mark: 'X', meaning: 'swap (Bell-state measurement)', tone: 'accent' },
  { mark: 'P', meaning: 'purification step (two-qubit gate, then a measurement)', tone: 'warn' },
  { mark: 'D', meaning: 'delivery', tone: 'good' },
  { mark: 'x', meaning: 'discard', tone: 'bad' },
  { mark: '*', meaning: 'another rule fired', tone: 'strong' },
  { mark: 'o', meaning: 'a message arrived and no rule fired', tone: 'dim' },
  { mark: '~', meaning: 'a wake-up and no rule fired', tone: 'dim' },
  { mark: '\\ /', meaning: 'a message on its way (time goes down)', tone: 'plain' },
  { mark: '> <', meaning: 'a message arriving', tone: 'plain' },
];

const TONE = new Map(TIMELINE_MARKS.map((m) => [m.mark, m.tone]));
const RANK = ['X', 'P', 'D', 'x', '*', '+', 'o', '~'];

/** The mark for what one rule firing did. */
export function fireMark(f: FireRecord): string {
  const a = f.actions;
  if (a.some((s) => s.startsWith('Bell-measured'))) return 'X';
  if (a.some((s) => /^(cnot|cz) /.test(s)) && a.some((s) => s.startsWith('measured'))) return 'P';
  if (a.some((s) => s.startsWith('delivered'))) return 'D';
  if (a.some((s) => s.startsWith('discarded'))) return 'x';
  return '*';
}

function better(a: string | undefined, b: string): string {
  return a === undefined || RANK.indexOf(b) < RANK.indexOf(a) ? b : a;
}

/** The mark of each site in one event. */
export function eventMarks(ev: EngineEvent): Map<string, string> {
  const marks = new Map<string, string>();
  if (ev.type === 'herald' && ev.pair) {
    const link = ev.pair.slice(0, ev.pair.indexOf('#'));
    for (const end of link.split('~')) marks.set(end, '+');
  }
  for (const f of ev.fires) marks.set(f.node, better(marks.get(f.node), fireMark(f)));
  if (!marks.has(ev.node)) marks.set(ev.node, ev.type === 'arrive' ? 'o' : ev.type === 'wake' ? '~' : '+');
  return marks;
}

interface Flight {
  readonly from: string;
  readonly to: string;
  readonly sent: number;
  readonly arrives: number;
  /** Index of the event that sent it. */
  readonly sentAt: number;
}

export interface TimelineInput {
  readonly net: Net;
  /** The world at the cursor (its in-flight messages continue below the last row). */
  readonly world: World;
  readonly records: RecordList;
  readonly log: EventLog;
  readonly cursor: number;
  readonly site: string;
  /** Rows scrolled back from the cursor. */
  readonly back: number;
}

/** How far back the chart looks for messages sent before its first row. */
const LOOKBACK = 512;

/** Exactly the visible lines of the timeline pane. */
export function timelineView(inp: TimelineInput, cols: number, rows: number): Line[] {
  const sites = chainOrder(inp.net) ?? [...inp.net.nodeIds];
  const labelW = 11;
  const room = Math.max(3, cols - labelW);
  const cw = Math.max(3, Math.min(9, Math.floor(room / sites.length)));
  const fits = Math.max(1, Math.floor(room / cw));
  const sel = Math.max(0, sites.indexOf(inp.site));
  const first = sites.length <= fits ? 0 : Math.max(0, Math.min(sites.length - fits, sel - Math.floor(fits / 2)));
  const shown = sites.slice(first, first + fits);
  const colOf = new Map(shown.map((s, i) => [s, i * cw + Math.floor(cw / 2)]));
  const gridW = shown.length * cw;

  const header: Seg[] = [{ text: ' '.repeat(labelW), tone: 'plain' }];
  for (const s of shown) {
    const name = fit(s, cw - 1);
    const left = Math.floor((cw - name.length) / 2);
    header.push({ text: ' '.repeat(left), tone: 'plain' }, { text: name, tone: s === inp.site ? 'select' : 'strong' }, { text: ' '.repeat(cw - left - name.length), tone: 'plain' });
  }
  const lines: Line[] = [header];
  if (inp.cursor === 0) {
    lines.push([{ text: 'no events yet: press → to step', tone: 'dim' }]);
    return lines;
  }
  const end = Math.max(0, inp.cursor - 1 - inp.back);
  const start = Math.max(0, end - (rows - 2));

  // messages that cross the window: sent in it or shortly before, plus those still in flight
  const flights = new Map<number, Flight>();
  const arrivedAt = new Map<number, number>();
  const take = (ev: EngineEvent, i: number) => {
    for (const s of ev.sends) if (!s.dropped) flights.set(s.id, { from: s.from, to: s.to, sent: s.sent, arrives: s.arrives, sentAt: i });
  };
  for (let i = start; i <= end; i++) {
    const ev = inp.log.get(i);
    if (!ev) continue;
    take(ev, i);
    if (ev.message) arrivedAt.set(ev.message, i);
  }
  // look back only as far as needed to find the senders of messages that arrive in the window
  let missing = [...arrivedAt.keys()].filter((id) => !flights.has(id)).length;
  for (let i = start - 1; i >= Math.max(0, start - LOOKBACK) && missing > 0; i--) {
    const ev = inp.log.get(i);
    if (!ev) continue;
    for (const snd of ev.sends) if (arrivedAt.has(snd.id) && !flights.has(snd.id)) missing--;
    take(ev, i);
  }
  if (inp.back === 0) {
    for (const m of inp.world.inflight.values()) {
      if (!flights.has(m.id)) flights.set(m.id, { from: m.from, to: m.to, sent: m.sent, arrives: m.arrives, sentAt: -1 });
    }
  }
  const tStart = start < inp.records.length ? inp.records.at(start)!.time_ns : 0;
  const live = [...flights.entries()].filter(([id, f]) => {
    const arr = arrivedAt.get(id);
    return arr === undefined ? f.arrives >= tStart : arr > start;
  });

  let prevT = start > 0 ? inp.records.at(start - 1)!.time_ns : 0;
  for (let r = start; r <= end; r++) {
    const rec = inp.records.at(r)!;
    const t = rec.time_ns;
    const cells: string[] = new Array(gridW).fill(' ');
    const tones: Tone[] = new Array(gridW).fill('plain');
    for (const [s, x] of colOf) {
      cells[x] = '│';
      tones[x] = s === inp.site ? 'accent' : 'dim';
    }
    for (const [id, f] of live) {
      const arr = arrivedAt.get(id);
      if (r <= f.sentAt || (arr !== undefined && r > arr)) continue;
      if ((f.sentAt < 0 && t < f.sent) || (arr === undefined && t > f.arrives)) continue;
      const xa = colPos(f.from, sites, first, cw);
      const xb = colPos(f.to, sites, first, cw);
      const dir = Math.sign(xb - xa);
      if (dir === 0) continue;
      // a message whose send and arrival rows are both known is a straight line between
      // them, as drawn by hand; one still in flight is placed by the time it has travelled
      const span = Math.max(1, f.arrives - f.sent);
      const frac = (row: number, time: number): number =>
        arr !== undefined && f.sentAt >= 0 ? (row - f.sentAt) / (arr - f.sentAt) : Math.min(1, Math.max(0, (time - f.sent) / span));
      const x0 = Math.round(xa + (xb - xa) * frac(r - 1, prevT));
      // on its arrival row the line ends in an arrowhead beside the receiver's mark
      const arriving = r === arr;
      const x1 = arriving ? xb - dir : Math.round(xa + (xb - xa) * frac(r, t));
      const from = x0 === x1 ? x1 : x0 + dir;
      for (let x = from; dir > 0 ? x <= x1 : x >= x1; x += dir) {
        if (x < 0 || x >= gridW || x === xb || x === xa) continue;
        cells[x] = x !== x1 ? '─' : arriving ? (dir > 0 ? '>' : '<') : dir > 0 ? '\\' : '/';
        tones[x] = 'plain';
      }
    }
    const ev = inp.log.get(r);
    const marks = ev ? eventMarks(ev) : new Map([[rec.node, rec.kind === 'arrive' ? 'o' : rec.kind === 'wake' ? '~' : '+']]);
    for (const [s, m] of marks) {
      const x = colOf.get(s);
      if (x === undefined) continue;
      cells[x] = m;
      tones[x] = TONE.get(m) ?? 'strong';
    }
    const atCursor = r === inp.cursor - 1;
    const segs: Seg[] = [
      { text: atCursor ? '▶' : ' ', tone: atCursor ? 'accent' : 'plain' },
      { text: `${padLeft(formatDuration(t), labelW - 2)} `, tone: atCursor ? 'select' : 'dim' },
    ];
    // neighbouring cells of one tone become one segment
    for (let x = 0; x < gridW; x++) {
      const last = segs[segs.length - 1];
      if (x > 0 && last.tone === tones[x]) segs[segs.length - 1] = { text: last.text + cells[x], tone: last.tone };
      else segs.push({ text: cells[x], tone: tones[x] });
    }
    lines.push(segs);
    prevT = t;
  }
  return lines;
}

/** The x position of a site's column, also for sites outside the shown window (negative or past the edge). */
function colPos(site: string, sites: readonly string[], first: number, cw: number): number {
  return (sites.indexOf(site) - first) * cw + Math.floor(cw / 2);
}
