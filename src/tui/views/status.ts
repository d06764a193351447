/**
 * The status line: where the cursor is (event and simulated time), how much is computed,
 * the seed, the breakpoints, autoplay, and why the last run stopped, all in words.
 */
import { formatDuration } from '../../model/units.js';
import type { Session } from '../../session/session.js';
import type { Line, Seg, Tone } from '../lines.js';

const STOP_WORDS: Record<string, string> = {
  start: 'at the start',
  event: 'stepped',
  time: 'jumped to a time',
  breakpoint: 'stopped at a breakpoint',
  stall: 'STALLED',
  idle: 'finished',
  limit: 'paused: no breakpoint hit yet',
  cancelled: 'stopped by Esc',
};

/** The status line's segments. */
export function statusLine(session: Session, autoplay: { rate: number; playing: boolean } | null, busy: string | undefined, cols: number): Line {
  // under 100 columns the labels shrink so the stop reason stays in view
  const narrow = cols < 100;
  const w = session.world();
  const c = session.cursor;
  const bps = session.breakpoints();
  const off = bps.filter((b) => !b.enabled).length;
  const stop = session.stop;
  const ending = session.ending();
  const sep: Seg = { text: ' │ ', tone: 'dim' };
  const segs: Seg[] = [];
  if (busy) segs.push({ text: `⏳ ${busy}`, tone: 'warn' }, sep);
  else if (autoplay) segs.push({ text: autoplay.playing ? `▶ playing ${autoplay.rate}/s` : '⏸ paused', tone: autoplay.playing ? 'good' : 'warn' }, sep);
  segs.push(
    { text: c === 0 ? (narrow ? 'start' : 'at the start') : narrow ? `#${c - 1}` : `event #${c - 1}`, tone: 'strong' },
    { text: narrow ? `/${session.total}` : ` of ${session.total} computed`, tone: 'plain' },
    sep,
    { text: `${narrow ? '' : 't '}${formatDuration(w.time)}`, tone: 'strong' },
    sep,
    { text: `seed ${session.seed}`, tone: 'plain' },
    sep,
    { text: `${bps.length} break${bps.length === 1 ? '' : 's'}${off ? ` (${off} off)` : ''}`, tone: bps.length ? 'accent' : 'dim' },
    sep,
  );
  let word = STOP_WORDS[stop.reason] ?? stop.reason;
  let tone: Tone = stop.reason === 'stall' ? 'bad' : stop.reason === 'breakpoint' ? 'accent' : stop.reason === 'idle' || stop.reason === 'limit' ? 'warn' : 'plain';
  if (ending === 'stall' && stop.reason !== 'stall') {
    word = 'STALLED here';
    tone = 'bad';
  } else if (ending === 'idle' && stop.reason !== 'idle') {
    word = 'the run ends here';
    tone = 'warn';
  }
  const detail = stop.reason === 'breakpoint' || stop.reason === 'stall' || stop.reason === 'idle' ? `: ${stop.detail}` : '';
  segs.push({ text: `${word}${detail}`, tone });
  return segs;
}
