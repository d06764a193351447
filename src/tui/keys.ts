/**
 * The key table: one typed list that drives both the key handler and the help overlay.
 * Keys follow common terminal habits (arrows, Tab, Enter, Esc, ?, q); nothing here is a
 * letter mnemonic apart from q for quit.
 */
import type { Key } from 'ink';

export type KeyAction =
  | 'step'
  | 'back'
  | 'continue'
  | 'reverse'
  | 'first'
  | 'last'
  | 'up'
  | 'down'
  | 'pageUp'
  | 'pageDown'
  | 'enter'
  | 'focusNext'
  | 'focusPrev'
  | 'play'
  | 'command'
  | 'goto'
  | 'help'
  | 'close'
  | 'quit';

export type KeyName = 'left' | 'right' | 'up' | 'down' | 'pageUp' | 'pageDown' | 'home' | 'end' | 'return' | 'escape' | 'tab';

/** One way to press a key: a named key (with or without Shift), or a typed character (optionally with Ctrl). */
export interface KeyChord {
  readonly name?: KeyName;
  readonly input?: string;
  readonly shift?: boolean;
  readonly ctrl?: boolean;
}

export interface KeyBinding {
  readonly action: KeyAction;
  readonly chords: readonly KeyChord[];
  /** How the keys are written in the help overlay. */
  readonly label: string;
  /** What the keys do, in plain words. */
  readonly does: string;
}

/** Every key of the debugger, in the order the help overlay lists them. */
export const KEYS: readonly KeyBinding[] = [
  { action: 'step', chords: [{ name: 'right' }], label: '→', does: 'step one event forward' },
  { action: 'back', chords: [{ name: 'left' }], label: '←', does: 'step one event back' },
  { action: 'continue', chords: [{ name: 'right', shift: true }, { input: '>' }], label: 'Shift+→  >', does: 'run forward to the next breakpoint hit, stall or end' },
  { action: 'reverse', chords: [{ name: 'left', shift: true }, { input: '<' }], label: 'Shift+←  <', does: 'run back to the previous breakpoint hit, or the start' },
  { action: 'first', chords: [{ name: 'home' }], label: 'Home', does: 'go to the start of the run' },
  { action: 'last', chords: [{ name: 'end' }], label: 'End', does: 'go to the last event computed so far' },
  { action: 'up', chords: [{ name: 'up' }], label: '↑', does: 'previous site, pair or event in the focused pane; scroll up elsewhere' },
  { action: 'down', chords: [{ name: 'down' }], label: '↓', does: 'next site, pair or event in the focused pane; scroll down elsewhere' },
  { action: 'pageUp', chords: [{ name: 'pageUp' }], label: 'PgUp', does: 'scroll the focused pane a page up (the timeline: back in time)' },
  { action: 'pageDown', chords: [{ name: 'pageDown' }], label: 'PgDn', does: 'scroll the focused pane a page down' },
  { action: 'enter', chords: [{ name: 'return' }], label: 'Enter', does: 'pairs: show or hide the Bell coefficients · events: go to the selected event · sites: read its rules' },
  { action: 'focusNext', chords: [{ name: 'tab' }], label: 'Tab', does: 'focus the next pane' },
  { action: 'focusPrev', chords: [{ name: 'tab', shift: true }], label: 'Shift+Tab', does: 'focus the previous pane' },
  { action: 'play', chords: [{ input: ' ' }], label: 'Space', does: 'pause or resume autoplay (teaching mode)' },
  { action: 'command', chords: [{ input: ':' }], label: ':', does: 'open the command line (Tab completes, Enter runs, Esc closes)' },
  { action: 'goto', chords: [{ input: '#' }], label: '#', does: 'open the command line with "go " typed: an event number or a time' },
  { action: 'help', chords: [{ input: '?' }], label: '?', does: 'show or hide this help' },
  { action: 'close', chords: [{ name: 'escape' }], label: 'Esc', does: 'close the help, a list or the command line' },
  { action: 'quit', chords: [{ input: 'q' }, { input: 'c', ctrl: true }], label: 'q  Ctrl+C', does: 'leave the debugger' },
];

function named(key: Key, name: KeyName): boolean {
  switch (name) {
    case 'left':
      return key.leftArrow;
    case 'right':
      return key.rightArrow;
    case 'up':
      return key.upArrow;
    case 'down':
      return key.downArrow;
    case 'pageUp':
      return key.pageUp;
    case 'pageDown':
      return key.pageDown;
    case 'home':
      return key.home;
    case 'end':
      return key.end;
    case 'return':
      return key.return;
    case 'escape':
      return key.escape;
    case 'tab':
      return key.tab;
  }
}

/** Whether a key press matches a chord. */
export function matches(chord: KeyChord, input: string, key: Key): boolean {
  if (chord.name) return named(key, chord.name) && (chord.shift ?? false) === key.shift;
  return input === chord.input && (chord.ctrl ?? false) === key.ctrl;
}

/** The action bound to a key press, if any. */
export function keyAction(input: string, key: Key): KeyAction | undefined {
  for (const b of KEYS) if (b.chords.some((c) => matches(c, input, key))) return b.action;
  return undefined;
}

/** The short key hints shown at the bottom when nothing else is there. */
export const KEY_HINTS = '→ step  ← back  Shift+→ continue  Tab pane  : command  ? help  q quit';

/** A key press with no key flags set: the base of the keys `splitKeys` makes. */
const PLAIN: Key = {
  upArrow: false, downArrow: false, leftArrow: false, rightArrow: false, pageDown: false, pageUp: false,
  home: false, end: false, return: false, escape: false, ctrl: false, shift: false, tab: false,
  backspace: false, delete: false, meta: false, super: false, hyper: false, capsLock: false, numLock: false,
} as Key;

/**
 * Splits what arrives in one piece (text pasted, or sent by a terminal multiplexer, such as
 * `:go 300000` and Enter) into the keys a person would have typed one by one, so it works
 * exactly as typed. A named key (an arrow, Esc, a Ctrl chord) passes through as it is.
 */
export function splitKeys(input: string, key: Key): [string, Key][] {
  const chars = [...input];
  const named = key.upArrow || key.downArrow || key.leftArrow || key.rightArrow || key.pageUp || key.pageDown || key.home || key.end || key.escape || key.ctrl || key.meta;
  if (chars.length <= 1 || named) return [[input, key]];
  return chars.map((c): [string, Key] => [
    c === '\r' || c === '\n' || c === '\t' || c === '\b' || c === '\u007f' ? '' : c,
    { ...PLAIN, return: c === '\r' || c === '\n', tab: c === '\t', backspace: c === '\b', delete: c === '\u007f', shift: c !== c.toLowerCase() },
  ]);
}
