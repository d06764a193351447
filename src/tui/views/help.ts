/**
 * The help overlay (keys, commands and the timeline's marks, all generated from their
 * tables) and the list overlay (breakpoints and watches with their state).
 */
import type { Session } from '../../session/session.js';
import { COMMANDS } from '../commands.js';
import { KEYS } from '../keys.js';
import type { Line } from '../lines.js';
import { pad, wrap } from '../text.js';
import { plural } from '../../model/words.js';
import { TIMELINE_MARKS } from './timeline.js';

function rows(items: readonly { left: string; right: string }[], cols: number): Line[] {
  const lw = Math.min(Math.max(...items.map((i) => i.left.length)) + 2, Math.floor(cols / 2));
  const out: Line[] = [];
  for (const it of items) {
    wrap(it.right, Math.max(10, cols - lw - 2)).forEach((l, i) => {
      out.push([
        { text: `  ${pad(i === 0 ? it.left : '', lw)}`, tone: i === 0 ? 'strong' : 'plain' },
        { text: l, tone: 'plain' },
      ]);
    });
  }
  return out;
}

/** Every line of the help overlay at a width. */
export function helpLines(cols: number): Line[] {
  return [
    [{ text: 'keys', tone: 'title' }],
    ...rows(KEYS.map((k) => ({ left: k.label, right: k.does })), cols),
    [{ text: '', tone: 'plain' }],
    [{ text: 'commands (press : then type; Tab completes; a mistake is shown, never fatal)', tone: 'title' }],
    ...rows(COMMANDS.map((c) => ({ left: `${c.word}${c.args ? ` ${c.args}` : ''}`, right: c.does })), cols),
    [{ text: '', tone: 'plain' }],
    [{ text: 'timeline marks (sites are columns, time goes down)', tone: 'title' }],
    ...rows(TIMELINE_MARKS.map((m) => ({ left: m.mark, right: m.meaning })), cols),
    [{ text: '', tone: 'plain' }],
    [{ text: 'rules pane: ✓ guard holds   ✗ guard fails, with what it waits for   · not reached', tone: 'plain' }],
    [{ text: 'Esc, ? or q closes this help; ↑ ↓ PgUp PgDn scroll it', tone: 'dim' }],
  ];
}

/** Every line of the breakpoints-and-watches overlay. */
export function listLines(session: Session, cols: number): Line[] {
  const bps = session.breakpoints();
  const ws = session.watches();
  const out: Line[] = [[{ text: bps.length ? `breakpoints (${bps.length})` : 'no breakpoints: add one with  break on fire SITE.RULE  or  break EXPR', tone: 'title' }]];
  for (const b of bps) {
    // wrap() joins words with single spaces, so the parts are set apart with dots
    out.push(...wrap(`${b.id} · ${b.enabled ? 'active' : 'disabled'} · ${b.spec} · hit ${plural(b.hits, 'time')}`, cols - 2, '    ').map((l): Line => [{ text: `  ${l}`, tone: b.enabled ? 'plain' : 'dim' }]));
  }
  out.push([{ text: '', tone: 'plain' }], [{ text: ws.length ? `watches (${ws.length})` : 'no watches: add one with  watch EXPR', tone: 'title' }]);
  for (const w of ws) {
    const changed = w.changedAt !== undefined ? `, changed at #${w.changedAt}` : '';
    out.push(...wrap(`${w.id} · ${w.spec} = ${w.error ? `? (${w.error})` : w.value}${changed}`, cols - 2, '    ').map((l): Line => [{ text: `  ${l}`, tone: w.error ? 'bad' : 'plain' }]));
  }
  out.push([{ text: '', tone: 'plain' }], [{ text: 'forget ID removes one, disable ID / enable ID switch a breakpoint; Esc closes', tone: 'dim' }]);
  return out;
}
