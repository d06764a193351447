/**
 * Builds what one frame shows from the controller: the status rows, the panes laid out for
 * the terminal with only their visible rows, the overlay if one is open, and the bottom
 * rows (command line, notes or key hints). The whole frame is rows − 1 tall at most.
 * Panes whose inputs did not change keep their lines, so React can skip them.
 */
import { plural } from '../model/words.js';
import { narrate } from '../session/narrate.js';
import type { Controller } from './controller.js';
import { KEY_HINTS } from './keys.js';
import { layout, type PaneId } from './layout.js';
import { fitLine, type Line, type RecordList } from './lines.js';
import { pad, wrap } from './text.js';
import { eventsView } from './views/events.js';
import { helpLines, listLines } from './views/help.js';
import { messagesView } from './views/messages.js';
import { networkView, type PaneView } from './views/network.js';
import { pairsAt, pairsView } from './views/pairs.js';
import { rulesView } from './views/rules.js';
import { statusLine } from './views/status.js';
import { timelineView } from './views/timeline.js';

export interface PaneModel {
  readonly id: PaneId;
  /** Content columns (without the divider). */
  readonly width: number;
  /** Rows including the title. */
  readonly height: number;
  readonly focused: boolean;
  readonly title: Line;
  /** The visible content rows. */
  readonly body: readonly Line[];
}

export interface ColumnModel {
  readonly width: number;
  readonly divider: boolean;
  readonly panes: readonly PaneModel[];
}

export interface FrameModel {
  readonly cols: number;
  /** Rows the frame takes (terminal rows − 1). */
  readonly rows: number;
  readonly top: readonly Line[];
  readonly columns: readonly ColumnModel[];
  /** Replaces the panes when the help or the list is open. */
  readonly overlay?: readonly Line[];
  readonly bottom: readonly Line[];
}

const NAMES: Record<PaneId, string> = {
  network: 'sites',
  pairs: 'pairs',
  rules: 'rules',
  messages: 'messages',
  events: 'events',
  timeline: 'timeline',
};

function title(id: PaneId, site: string, focused: boolean, note: string | undefined, cols: number): Line {
  const name = id === 'pairs' ? `pairs at ${site}` : id === 'rules' ? `rules of ${site}` : NAMES[id];
  const text = `${focused ? '▶ ' : '  '}${focused ? name.toUpperCase() : name}${note ? ` · ${note}` : ''} `;
  return fitLine([{ text, tone: focused ? 'focus' : 'title' }, { text: '─'.repeat(Math.max(0, cols - text.length)), tone: 'dim' }], cols);
}

/** Keeps `anchor` within the window starting at `offset`, and the window within the lines. */
function windowAt(offset: number, anchor: number | undefined, h: number, len: number): number {
  let o = offset;
  if (anchor !== undefined) {
    if (anchor < o) o = anchor;
    if (anchor >= o + h) o = anchor - h + 1;
  }
  return Math.max(0, Math.min(o, len - h));
}

const cache = new WeakMap<Controller, Map<PaneId, { key: string; model: PaneModel }>>();

/** The session's event records as the panes read them: one at a time, summaries recomputed when no longer kept. */
function recordList(s: Controller['session']): RecordList {
  const h = s.history;
  return { length: h.frontier, at: (i) => (i >= 0 && i < h.frontier ? h.record(i) : undefined) };
}

function paneModel(c: Controller, id: PaneId, width: number, height: number): PaneModel {
  const s = c.session;
  const net = s.engine.net;
  const rows = Math.max(0, height - 1);
  const focused = c.focus === id;
  if (focused) c.pageRows = Math.max(1, rows - 1);
  const pane = id === 'pairs' ? [...c.bellOpen].join(',') + `|${c.pairSel}` : id === 'events' ? `${c.eventSel}|${s.total}|${c.autoplay !== null}` : '';
  const keyOf = () => `${s.cursor}|${c.site}|${focused}|${width}x${height}|${c.scroll[id]}|${pane}`;
  const key = keyOf();
  let byPane = cache.get(c);
  if (!byPane) cache.set(c, (byPane = new Map()));
  const hit = byPane.get(id);
  // every pane reads only the cursor's world and the inputs in its key
  if (hit && hit.key === key) return hit.model;

  const w = s.world();
  let body: Line[];
  let note: string | undefined;
  if (id === 'events') {
    const sel = c.eventSel ?? Math.max(0, s.cursor - 1);
    body = eventsView({ records: recordList(s), cursor: s.cursor, selected: sel, focused, narration: c.autoplay ? undefined : narrate(s.event()) }, width, rows);
    note = `${s.total} computed`;
  } else if (id === 'timeline') {
    body = timelineView({ net, world: w, records: recordList(s), log: c.log, cursor: s.cursor, site: c.site, back: c.scroll.timeline }, width, rows);
    note = c.scroll.timeline ? `${plural(c.scroll.timeline, 'event')} back` : 'time ↓';
  } else {
    let v: PaneView;
    if (id === 'network') v = networkView(net, w, c.site, width);
    else if (id === 'pairs') v = pairsView(pairsAt(net, w, c.site), c.pairSel, c.bellOpen, width, focused);
    else if (id === 'rules') v = rulesView(s.explain(c.site), c.site, width);
    else v = messagesView(w, c.site, width);
    const off = windowAt(c.scroll[id], v.anchor, rows, v.lines.length);
    c.scroll[id] = off;
    body = v.lines.slice(off, off + rows) as Line[];
    note = v.note;
    if (v.lines.length > rows) note = `${note ? `${note} · ` : ''}${off + 1}–${Math.min(v.lines.length, off + rows)} of ${v.lines.length}`;
  }
  const model: PaneModel = { id, width, height, focused, title: title(id, c.site, focused, note, width), body: body.map((l) => fitLine(l, width)) };
  // the key read the clamped offset; store under the final one
  byPane.set(id, { key: keyOf(), model });
  return model;
}

function bottomRows(c: Controller, cols: number): Line[] {
  if (c.mode === 'command') {
    const hint = c.command.hint;
    const lines: Line[] = (hint?.lines ?? []).slice(0, 3).flatMap((l) => wrap(l, cols).slice(0, 2)).map((l): Line => [{ text: l, tone: hint!.tone }]);
    lines.push([{ text: '› ', tone: 'accent' }, { text: c.command.text, tone: 'strong' }, { text: '█', tone: 'plain' }]);
    return lines;
  }
  if (c.busy) return [[{ text: 'Esc stops it here · q quits', tone: 'warn' }]];
  if (c.note) return c.note.lines.slice(0, 2).map((l): Line => [{ text: l, tone: c.note!.tone }]);
  return [[{ text: KEY_HINTS, tone: 'dim' }]];
}

function topRows(c: Controller, cols: number): Line[] {
  const s = c.session;
  const top: Line[] = [statusLine(s, c.autoplay, c.busy, cols)];
  if (c.autoplay) {
    // teaching mode: the narration on top, up to three rows, cut with … beyond that
    const all = wrap(narrate(s.event()), cols - 3);
    const said = all.slice(0, 3);
    if (all.length > 3) said[2] = `${said[2]} …`;
    for (const l of said) top.push([{ text: pad(` ${l}`, cols), tone: 'select' }]);
  }
  const ws = s.watches().slice(0, 3);
  for (const w of ws) {
    const changed = w.changedAt !== undefined ? ` · changed at #${w.changedAt}` : '';
    top.push([{ text: `watch ${w.id} `, tone: 'accent' }, { text: `${w.spec} = ${w.error ? `? ${w.error}` : w.value}${changed}`, tone: w.error ? 'bad' : 'plain' }]);
  }
  return top;
}

/** The frame for a terminal of `cols` × `termRows`. */
export function buildFrame(c: Controller, cols: number, termRows: number): FrameModel {
  const rows = Math.max(4, termRows - 1);
  const top = topRows(c, cols).map((l) => fitLine(l, cols));
  const bottom = bottomRows(c, cols).map((l) => fitLine(l, cols));
  const bodyRows = Math.max(2, rows - top.length - bottom.length);
  if (c.mode === 'help' || c.mode === 'list') {
    const all = c.mode === 'help' ? helpLines(cols) : listLines(c.session, cols);
    c.pageRows = Math.max(1, bodyRows - 1);
    c.overlayScroll = Math.max(0, Math.min(c.overlayScroll, all.length - bodyRows));
    return { cols, rows, top, columns: [], overlay: all.slice(c.overlayScroll, c.overlayScroll + bodyRows).map((l) => fitLine(l, cols)), bottom };
  }
  const lay = layout(cols, bodyRows, c.focus);
  const columns: ColumnModel[] = lay.columns.map((col, i) => {
    const divider = i > 0;
    const inner = col.width - (divider ? 1 : 0);
    return { width: col.width, divider, panes: col.panes.map((p) => paneModel(c, p.id, inner, p.height)) };
  });
  return { cols, rows, top, columns, bottom };
}
