/**
 * How a long range is drawn: the plot is cut into time bands, and within a band each site
 * shows one shape per kind of mark that happened there (each kind in its own lane beside the
 * site line), the messages between two sites become one arrow whose width grows with their
 * number, and the pairs a link made become one tie. Counts are in each shape's tooltip.
 */
import { spanText } from './chart-axis.js';
import { n, type Canvas } from './chart-canvas.js';
import type { ChartBond, ChartMark, ChartMessage, MarkKind } from './chart-data.js';
import { MARK_MEANINGS } from './chart-style.js';
import { xmlText } from './xml.js';

/** Horizontal offset of each kind's lane from the site line. */
const LANE = new Map<MarkKind, number>(MARK_MEANINGS.map((m, i) => [m.kind, (i - (MARK_MEANINGS.length - 1) / 2) * 14]));

interface Tally<T> {
  readonly first: T;
  readonly items: T[];
}

function tally<T>(items: readonly T[], key: (x: T) => string): Tally<T>[] {
  const out = new Map<string, Tally<T>>();
  for (const x of items) {
    const k = key(x);
    const g = out.get(k);
    if (g) g.items.push(x);
    else out.set(k, { first: x, items: [x] });
  }
  return [...out.values()];
}

function between(c: Canvas, band: number): string {
  const t0 = c.d.start + band * c.bandNs;
  return `${spanText(t0)} and ${spanText(t0 + c.bandNs)}`;
}

function marks(c: Canvas, list: readonly ChartMark[]): string[] {
  return tally(list, (m) => `${m.site} ${m.kind} ${c.band(m.time)}`).map((g) => {
    const m = g.first;
    const band = c.band(m.time);
    const label = MARK_MEANINGS.find((k) => k.kind === m.kind)!.label;
    const what = `${g.items.length} × ${label} at ${m.site} between ${between(c, band)}`;
    return `<use xlink:href="#${m.kind}" x="${n(c.x(m.site) + LANE.get(m.kind)!)}" y="${n(c.bandY(band))}"><title>${xmlText(what)}</title></use>`;
  });
}

function messages(c: Canvas, list: readonly ChartMessage[]): string[] {
  return tally(list, (m) => `${m.from} ${m.to} ${c.band(m.sent)}`).map((g) => {
    const m = g.first;
    let sent = 0;
    let arrives = 0;
    const kinds = new Map<string, number>();
    let lost = 0;
    for (const x of g.items) {
      sent += x.sent;
      arrives += x.arrives;
      kinds.set(x.kind, (kinds.get(x.kind) ?? 0) + 1);
      if (x.lost) lost++;
    }
    const k = g.items.length;
    // the two directions between a pair of sites would cover each other: rightward arrows sit a little higher
    const lift = c.x(m.to) > c.x(m.from) ? -3 : 3;
    const y1 = c.y(sent / k) + lift;
    const y2 = c.y(arrives / k) + lift;
    const x1 = c.x(m.from);
    const x2 = c.x(m.to);
    const width = Math.min(4.5, 0.8 + 0.7 * Math.log2(k));
    const d = m.from === m.to ? `M${n(x1)},${n(y1)} C${n(x1 + 36)},${n(y1)} ${n(x2 + 36)},${n(y2)} ${n(x2)},${n(y2)}` : `M${n(x1)},${n(y1)} L${n(x2)},${n(y2)}`;
    const byKind = [...kinds].map(([kind, count]) => `${kind} ${count}`).join(', ');
    const what = `${k} ${k === 1 ? 'message' : 'messages'} ${m.from}→${m.to} sent between ${between(c, c.band(m.sent))}: ${byKind}${lost ? `; ${lost} lost` : ''}`;
    const cls = lost === k ? 'msg lost' : 'msg';
    return `<g class="${cls}"><title>${xmlText(what)}</title><path d="${d}" style="stroke-width:${n(width)}" marker-end="url(#${lost === k ? 'lost-end' : 'head'})"/></g>`;
  });
}

function bonds(c: Canvas, list: readonly ChartBond[]): string[] {
  return tally(list, (b) => `${b.ends.join('~')} ${c.band(b.time)}`).map((g) => {
    const b = g.first;
    const band = c.band(b.time);
    const y = n(c.bandY(band));
    const what = `${g.items.length} ${g.items.length === 1 ? 'pair' : 'pairs'} made on ${b.ends.join('~')} between ${between(c, band)}`;
    return `<line class="bond" x1="${n(c.x(b.ends[0]))}" y1="${y}" x2="${n(c.x(b.ends[1]))}" y2="${y}"><title>${xmlText(what)}</title></line>`;
  });
}

/** The body of a thinned chart: ties, then arrows, then marks on top. */
export function thinnedBody(c: Canvas): string[] {
  return [...bonds(c, c.d.bonds), ...messages(c, c.d.messages), ...marks(c, c.d.marks)];
}

/** What a thinned picture says about itself. */
export function thinnedNote(c: Canvas, limit: number): string {
  const events = c.d.to - c.d.from + 1;
  return (
    `Thinned: ${events.toLocaleString('en-US')} events is more than ${limit.toLocaleString('en-US')}, so the plot is cut into bands of ${spanText(c.bandNs)}. ` +
    'In each band a site shows each kind of mark once, in its own lane, and the messages one way between two sites are one arrow, wider for more. Point at a shape for its counts.'
  );
}
