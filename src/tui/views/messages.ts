/**
 * The messages pane: classical messages in flight (sender → receiver, kind, the pair they
 * are about, time to arrival), soonest first, then messages that arrived and wait unread
 * in an inbox. Messages to or from the selected site are set in bold.
 */
import { shortPairId, type World } from '../../engine/index.js';
import { formatDuration } from '../../model/units.js';
import type { Line } from '../lines.js';
import { wrap } from '../text.js';
import type { PaneView } from './network.js';

/** The messages pane's lines at the world's time. */
export function messagesView(w: World, site: string, cols: number): PaneView {
  const lines: Line[] = [];
  const flying = [...w.inflight.values()].sort((a, b) => a.arrives - b.arrives || String(a.id).localeCompare(String(b.id)));
  const push = (text: string, tone: Line[number]['tone']) => {
    for (const l of wrap(text, cols, '    ')) lines.push([{ text: l, tone }]);
  };
  lines.push([{ text: flying.length ? `in flight (${flying.length})` : 'nothing in flight', tone: 'title' }]);
  for (const m of flying) {
    const about = m.pair ? ` about ${shortPairId(m.pair)}` : '';
    push(`${m.from} → ${m.to}  ${m.kind}${about}  arrives in ${formatDuration(m.arrives - w.time)}`, m.from === site || m.to === site ? 'strong' : 'plain');
  }
  let waiting = 0;
  for (const id of Object.keys(w.nodes).sort()) {
    const inbox = w.nodes[id].inbox;
    if (inbox.length === 0) continue;
    waiting += inbox.length;
    lines.push([{ text: `unread at ${id} (${inbox.length})`, tone: 'title' }]);
    for (const m of inbox) {
      const about = m.pair ? ` about ${shortPairId(m.pair)}` : '';
      push(`${m.kind} from ${m.from}${about}, waiting ${formatDuration(w.time - m.arrives)}`, id === site ? 'warn' : 'plain');
    }
  }
  return { lines, note: `${flying.length} in flight${waiting ? `, ${waiting} unread` : ''}` };
}
