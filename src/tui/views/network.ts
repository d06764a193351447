/**
 * The network pane: the sites and links as text. A chain is drawn as a line of sites joined
 * by links carrying their pair counts; below it (or alone, for other shapes) one row per
 * site lists its memory use, its links with their pair counts and any waiting messages.
 */
import { plural } from '../../model/words.js';
import type { Net, World } from '../../engine/index.js';
import type { Line, Seg } from '../lines.js';
import { pad, width } from '../text.js';
import { chainOrder } from '../../report/site-order.js';

/** The sites of a chain in order from one end (shared with the chart). */
export { chainOrder };

export interface PaneView {
  /** Every line of the pane's content (the pane shows a window of them). */
  readonly lines: readonly Line[];
  /** The line to keep in view (the selection), if any. */
  readonly anchor?: number;
  /** Extra words for the title, e.g. a count. */
  readonly note?: string;
}

/** Pairs held across a link right now: halves at its first end in its slots whose partner is the other end. */
export function linkPairCount(net: Net, w: World, linkId: string): number {
  const def = net.links.get(linkId)?.def;
  if (!def) return 0;
  const [a, b] = def.ends;
  let n = 0;
  for (const p of Object.values(w.nodes[a]?.pairs ?? {})) if (p.link === linkId && p.partner === b) n++;
  return n;
}

function linkId(a: string, b: string): string {
  return a < b ? `${a}~${b}` : `${b}~${a}`;
}

/** The chain drawn as text, wrapped onto at most three lines; none when it does not fit. */
function chainPicture(net: Net, w: World, order: readonly string[], site: string, cols: number): Line[] {
  const tokens: Seg[][] = [];
  order.forEach((id, i) => {
    const tok: Seg[] = [];
    if (i > 0) {
      const n = linkPairCount(net, w, linkId(order[i - 1], id));
      tok.push({ text: `─${n}─`, tone: n > 0 ? 'good' : 'dim' });
    }
    tok.push(id === site ? { text: `[${id}]`, tone: 'select' } : { text: id, tone: 'strong' });
    tokens.push(tok);
  });
  const out: Seg[][] = [[]];
  let used = 0;
  for (const tok of tokens) {
    const tw = width(tok.map((s) => s.text).join(''));
    if (used + tw > cols && used > 0) {
      out.push([]);
      used = 0;
    }
    out[out.length - 1].push(...tok);
    used += tw;
  }
  if (out.length > 3 || out.some((l) => width(l.map((s) => s.text).join('')) > cols)) return [];
  return out;
}

/** The network pane's lines for the selected site, at a width. */
export function networkView(net: Net, w: World, site: string, cols: number): PaneView {
  const lines: Line[] = [];
  const order = chainOrder(net);
  if (order) {
    const pic = chainPicture(net, w, order, site, cols);
    if (pic.length) lines.push(...pic, [{ text: '', tone: 'plain' }]);
  }
  const ids = order ?? net.nodeIds;
  const idW = Math.min(12, Math.max(...ids.map((id) => width(id))));
  let anchor = 0;
  for (const id of ids) {
    const node = w.nodes[id];
    const selected = id === site;
    if (selected) anchor = lines.length;
    const held = Object.keys(node.pairs).length;
    const segs: Seg[] = [
      { text: selected ? '▸ ' : '  ', tone: selected ? 'select' : 'plain' },
      { text: pad(id, idW), tone: selected ? 'select' : 'strong' },
      { text: ` ${held}/${net.qubitsAt.get(id) ?? 0}q`, tone: 'dim' },
    ];
    for (const lid of net.linksAt.get(id) ?? []) {
      const def = net.links.get(lid)!.def;
      const other = def.ends[0] === id ? def.ends[1] : def.ends[0];
      const n = linkPairCount(net, w, lid);
      segs.push({ text: ` ${other}:`, tone: 'plain' }, { text: String(n), tone: n > 0 ? 'good' : 'dim' });
    }
    if (node.inbox.length) segs.push({ text: `  ✉${node.inbox.length}`, tone: 'warn' });
    if (node.busyUntil > w.time) segs.push({ text: '  busy', tone: 'warn' });
    lines.push(segs);
  }
  return { lines, anchor, note: `${plural(net.nodeIds.length, 'site')}, ${plural(net.links.size, 'link')}` };
}
