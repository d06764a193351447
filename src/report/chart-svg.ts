/**
 * The space-time chart as a standalone SVG: sites as columns in network order, simulated
 * time going down, messages as slanted arrows from send to arrival labelled with their
 * kind, and a distinct shape for each kind of mark. Ranges of up to FULL_LIMIT events are
 * drawn in full; longer ones are thinned into time bands (chart-thinned.ts), and the
 * picture says so.
 */
import { spanText, timeTicks } from './chart-axis.js';
import { Canvas, FULL_LIMIT, LEFT, n, plural, RIGHT } from './chart-canvas.js';
import type { ChartBond, ChartData, ChartMark, ChartMessage } from './chart-data.js';
import { CHART_CSS, CHART_DEFS, MARK_MEANINGS } from './chart-style.js';
import { thinnedBody, thinnedNote } from './chart-thinned.js';
import { xmlText } from './xml.js';

export { FULL_LIMIT } from './chart-canvas.js';

function header(c: Canvas): string[] {
  const d = c.d;
  const sub = [
    `seed ${d.seed}`,
    `events ${d.from}–${d.to} of ${d.total}`,
    `${spanText(d.start)} to ${spanText(d.end)} of simulated time, going down`,
    plural(d.messages.length, 'message'),
    plural(d.bonds.length, 'link pair'),
  ].join(' · ');
  c.layoutHeader(d.title, [sub], c.thinned ? [thinnedNote(c, FULL_LIMIT)] : []);
  return [...c.header.map((l) => `<text class="${l.cls}" x="24" y="${l.y}">${xmlText(l.text)}</text>`), ...legend(c)];
}

function legend(c: Canvas): string[] {
  const out: string[] = [];
  const at = (i: number) => ({ x: 24 + (i % c.legendPerRow) * 200, y: c.legendTop + Math.floor(i / c.legendPerRow) * 20 });
  MARK_MEANINGS.forEach((m, i) => {
    const p = at(i);
    out.push(`<use xlink:href="#${m.kind}" x="${p.x + 8}" y="${p.y}"/><text class="legend" x="${p.x + 22}" y="${p.y + 4}">${xmlText(m.label)}</text>`);
  });
  const keys = [
    { stroke: '#36465f', dash: '', head: 'head', label: 'message, from send to arrival' },
    { stroke: '#a8321f', dash: ' stroke-dasharray="4 3"', head: 'lost-end', label: 'message lost or dropped' },
  ];
  keys.forEach((k, i) => {
    const p = at(MARK_MEANINGS.length + i);
    out.push(
      `<g class="key"><line x1="${p.x}" y1="${p.y - 4}" x2="${p.x + 16}" y2="${p.y + 4}" stroke="${k.stroke}" stroke-width="1.1"${k.dash} marker-end="url(#${k.head})"/>` +
        `<text class="legend" x="${p.x + 26}" y="${p.y + 4}">${xmlText(k.label)}</text></g>`,
    );
  });
  return out;
}

function frame(c: Canvas): string[] {
  const out: string[] = [];
  const top = c.plotTop;
  const bottom = top + c.plotHeight;
  for (const t of timeTicks(c.d.start, c.tEnd, Math.max(4, Math.round(c.plotHeight / 80)))) {
    const y = c.y(t.time);
    out.push(`<line class="grid" x1="${LEFT - 6}" y1="${n(y)}" x2="${n(c.width - RIGHT)}" y2="${n(y)}"/><text class="tick" x="${LEFT - 10}" y="${n(y + 3.5)}">${xmlText(t.label)}</text>`);
  }
  for (const s of c.d.sites) {
    const x = n(c.x(s));
    out.push(`<line class="site-line" x1="${x}" y1="${top - 6}" x2="${x}" y2="${n(bottom + 6)}"/>`);
    out.push(`<text class="site" x="${x}" y="${top - 14}">${xmlText(s)}</text>`);
    out.push(`<text class="site" x="${x}" y="${n(bottom + 24)}">${xmlText(s)}</text>`);
  }
  return out;
}

function bondLine(c: Canvas, b: ChartBond): string {
  const y = n(c.y(b.time));
  const what = `${b.pair} made at ${spanText(b.time)} (event ${b.event})`;
  return `<line class="bond" x1="${n(c.x(b.ends[0]))}" y1="${y}" x2="${n(c.x(b.ends[1]))}" y2="${y}"><title>${xmlText(what)}</title></line>`;
}

function arrow(c: Canvas, m: ChartMessage): string {
  const x1 = c.x(m.from);
  const y1 = c.y(m.sent);
  const x2 = c.x(m.to);
  const y2 = c.y(m.arrives);
  // a message to the sender itself bends out to the right
  const self = m.from === m.to;
  const d = self ? `M${n(x1)},${n(y1)} C${n(x1 + 36)},${n(y1)} ${n(x2 + 36)},${n(y2)} ${n(x2)},${n(y2)}` : `M${n(x1)},${n(y1)} L${n(x2)},${n(y2)}`;
  // the label runs along the arrow, never upside down
  let angle = self ? 90 : (Math.atan2(y2 - y1, x2 - x1) * 180) / Math.PI;
  if (angle > 90) angle -= 180;
  if (angle < -90) angle += 180;
  const mx = self ? x1 + 30 : (x1 + x2) / 2;
  const my = (y1 + y2) / 2;
  const when = `${spanText(m.sent)} → ${m.lost ? `lost (it would have arrived at ${spanText(m.arrives)})` : spanText(m.arrives)}`;
  const what = `${m.kind} ${m.from}→${m.to}${m.pair ? ` about ${m.pair}` : ''}, ${when}, sent in event ${m.event}`;
  return (
    `<g class="msg${m.lost ? ' lost' : ''}"><title>${xmlText(what)}</title><path d="${d}" marker-end="url(#${m.lost ? 'lost-end' : 'head'})"/>` +
    `<text transform="translate(${n(mx)},${n(my)}) rotate(${n(angle)})" y="-3">${xmlText(m.kind)}</text></g>`
  );
}

/** Marks at one site in one event sit side by side rather than on top of each other. */
function marks(c: Canvas, list: readonly ChartMark[]): string[] {
  const seen = new Map<string, number>();
  return list.map((m) => {
    const key = `${m.event} ${m.site}`;
    const k = seen.get(key) ?? 0;
    seen.set(key, k + 1);
    return `<use xlink:href="#${m.kind}" x="${n(c.x(m.site) + Math.min(k, 3) * 11)}" y="${n(c.y(m.time))}"><title>${xmlText(m.note)}</title></use>`;
  });
}

function body(c: Canvas): string[] {
  if (c.thinned) return thinnedBody(c);
  const d = c.d;
  return [...d.bonds.map((b) => bondLine(c, b)), ...d.messages.map((m) => arrow(c, m)), ...marks(c, d.marks)];
}

/** The chart as SVG text, with every text escaped. */
export function renderChart(d: ChartData): string {
  const c = new Canvas(d);
  // the header decides where the plot starts, so it is laid out first
  const top = header(c);
  const w = n(c.width);
  const h = n(c.height);
  const desc = `Space-time chart of events ${d.from} to ${d.to} of a recorded bellstep run: sites ${d.sites.join(', ')} as columns, simulated time going down.`;
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}" role="img" aria-labelledby="chart-title chart-desc">`,
    `<title id="chart-title">${xmlText(d.title)}</title>`,
    `<desc id="chart-desc">${xmlText(desc)}</desc>`,
    `<style>${CHART_CSS}</style>`,
    `<defs>${CHART_DEFS}</defs>`,
    `<rect class="bg" x="0" y="0" width="${w}" height="${h}"/>`,
    ...top,
    ...frame(c),
    ...body(c),
    '</svg>',
    '',
  ].join('\n');
}

/** A one-line note on what was drawn, for the command's stderr. */
export function chartNote(d: ChartData): string {
  const thinned = d.to - d.from + 1 > FULL_LIMIT;
  return `${thinned ? 'thinned ' : ''}chart of events ${d.from}–${d.to}: ${plural(d.sites.length, 'site')}, ${plural(d.messages.length, 'message')}, ${plural(d.marks.length, 'mark')}`;
}
