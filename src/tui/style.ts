/**
 * Tones to Ink text props. With colour, each tone has a colour of our own choosing; without
 * it (NO_COLOR), only bold and inverse remain, and the symbols and words the views put in
 * every line carry the meaning.
 */
import type { Tone } from './lines.js';

export interface ToneProps {
  color?: string;
  bold?: boolean;
  dimColor?: boolean;
  inverse?: boolean;
}

const COLOURED: Record<Tone, ToneProps> = {
  plain: {},
  dim: { dimColor: true },
  strong: { bold: true },
  accent: { color: 'blueBright' },
  good: { color: 'green' },
  warn: { color: 'yellow' },
  bad: { color: 'redBright' },
  select: { inverse: true, bold: true },
  title: { color: 'magentaBright' },
  focus: { inverse: true, bold: true, color: 'magentaBright' },
};

const MONO: Record<Tone, ToneProps> = {
  plain: {},
  dim: {},
  strong: { bold: true },
  accent: {},
  good: {},
  warn: {},
  bad: { bold: true },
  select: { inverse: true, bold: true },
  title: {},
  focus: { inverse: true, bold: true },
};

/** Ink props for a tone, with or without colour. */
export function toneProps(tone: Tone | undefined, colour: boolean): ToneProps {
  return (colour ? COLOURED : MONO)[tone ?? 'plain'];
}

/** Whether colour is wanted: the NO_COLOR convention (set and not empty means no colour). */
export function wantsColour(env: Readonly<Record<string, string | undefined>>): boolean {
  return !(env.NO_COLOR !== undefined && env.NO_COLOR !== '');
}
