/**
 * Tones to terminal styles. With colour, each tone has a colour of our own choosing; without
 * it (NO_COLOR), only bold and inverse remain, and the symbols and words the views put in
 * every line carry the meaning.
 */
import type { Tone } from './lines.js';

/** SGR parameters: bold 1, dim 2, inverse 7, bright blue 94, green 32, yellow 33, bright red 91, bright magenta 95. */
const COLOURED: Record<Tone, string> = {
  plain: '',
  dim: '2',
  strong: '1',
  accent: '94',
  good: '32',
  warn: '33',
  bad: '91',
  select: '7;1',
  title: '95',
  focus: '7;1;95',
};

const MONO: Record<Tone, string> = {
  plain: '',
  dim: '',
  strong: '1',
  accent: '',
  good: '',
  warn: '',
  bad: '1',
  select: '7;1',
  title: '',
  focus: '7;1',
};

const codes = (table: Record<Tone, string>) =>
  Object.fromEntries(Object.entries(table).map(([tone, p]) => [tone, p === '' ? '' : `\x1b[${p}m`])) as Record<Tone, string>;
const COLOURED_CODES = codes(COLOURED);
const MONO_CODES = codes(MONO);

/** The escape sequence that starts a tone's style ('' for none), with or without colour. */
export function toneCodes(tone: Tone | undefined, colour: boolean): string {
  return (colour ? COLOURED_CODES : MONO_CODES)[tone ?? 'plain'];
}

/** Whether colour is wanted: the NO_COLOR convention (set and not empty means no colour). */
export function wantsColour(env: Readonly<Record<string, string | undefined>>): boolean {
  return !(env.NO_COLOR !== undefined && env.NO_COLOR !== '');
}
