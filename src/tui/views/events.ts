/**
 * The events pane: the cursor's event told in one plain sentence (narrate), then a window
 * of the event list around the selection. Events already computed beyond the cursor
 * (after a step back) are shown dim. Only the visible rows are built.
 */
import { formatDuration } from '../../model/units.js';
import type { Line, RecordList, Seg } from '../lines.js';
import { fit, pad, padLeft, wrap } from '../text.js';

export interface EventsInput {
  readonly records: RecordList;
  /** Events applied at the cursor (the cursor's event is records[cursor − 1]). */
  readonly cursor: number;
  /** Index of the selected event (moved with ↑/↓ while the pane has focus). */
  readonly selected: number;
  readonly focused: boolean;
  /** The narration to show on top, or undefined when teaching mode shows it elsewhere. */
  readonly narration?: string;
}

/** Exactly the visible lines of the events pane. */
export function eventsView(inp: EventsInput, cols: number, rows: number): Line[] {
  const lines: Line[] = [];
  if (inp.narration !== undefined) {
    const said = wrap(inp.narration, cols - 2, '');
    const keep = Math.max(1, Math.min(3, rows - 2));
    said.slice(0, keep).forEach((l, i) => {
      const last = i === keep - 1 && said.length > keep;
      lines.push([{ text: `${i === 0 ? '» ' : '  '}${last ? fit(`${l} …`, cols - 2) : l}`, tone: 'strong' }]);
    });
  }
  const room = rows - lines.length;
  const total = inp.records.length;
  if (room <= 0) return lines;
  if (total === 0) {
    lines.push([{ text: 'no events yet: press → to step', tone: 'dim' }]);
    return lines;
  }
  const sel = Math.min(Math.max(0, inp.selected), total - 1);
  // keep the selection in view with one computed event after it when there is one
  const end = Math.min(total - 1, Math.max(sel + 1, room - 1));
  const start = Math.max(0, Math.min(sel, end - room + 1));
  const idxW = String(total - 1).length + 1;
  for (let i = start; i <= Math.min(total - 1, start + room - 1); i++) {
    const r = inp.records.at(i)!;
    const atCursor = i === inp.cursor - 1;
    const ahead = i >= inp.cursor;
    const isSel = inp.focused && i === sel;
    const mark: Seg = { text: atCursor ? '▶ ' : isSel ? '▸ ' : '  ', tone: isSel ? 'select' : atCursor ? 'accent' : 'plain' };
    const head = `${pad(`#${r.index}`, idWSafe(idxW))} ${padLeft(formatDuration(r.time_ns), 10)}  `;
    const tone = isSel ? 'select' : atCursor ? 'strong' : ahead ? 'dim' : 'plain';
    lines.push([mark, { text: fit(head + r.summary, cols - 2), tone }]);
  }
  return lines;
}

function idWSafe(n: number): number {
  return Math.max(3, n);
}
