/**
 * What panes draw: lines made of segments, each with a tone. Tones say what a piece of
 * text means (good, warning, selected...); style.ts turns them into colours or, without
 * colour, into nothing, so meaning never rests on colour alone.
 */
import type { ReplayEvent } from '../session/replay.js';
import { fit, width } from './text.js';

/** What a piece of text means, for styling. */
export type Tone = 'plain' | 'dim' | 'strong' | 'accent' | 'good' | 'warn' | 'bad' | 'select' | 'title' | 'focus';

export interface Seg {
  readonly text: string;
  readonly tone?: Tone;
}

export type Line = readonly Seg[];

/** A line of one segment. */
export function plain(text: string, tone: Tone = 'plain'): Line {
  return [{ text, tone }];
}

/** The text of a line without its tones. */
export function lineText(l: Line): string {
  return l.map((s) => s.text).join('');
}

/** Cuts a line to `w` columns, keeping the tones of what remains. */
export function fitLine(l: Line, w: number): Line {
  const out: Seg[] = [];
  let used = 0;
  const total = width(lineText(l));
  if (total <= w) return l;
  for (const s of l) {
    const room = w - used;
    if (room <= 0) break;
    const sw = width(s.text);
    if (sw < room) {
      out.push(s);
      used += sw;
    } else {
      // the segment that crosses the edge carries the cut mark
      out.push({ text: fit(s.text + '  ', room), tone: s.tone });
      used = w;
    }
  }
  return out;
}

/** Event records as panes read them: a list, or the session's history (one record at a time). */
export interface RecordList {
  readonly length: number;
  at(i: number): ReplayEvent | undefined;
}
