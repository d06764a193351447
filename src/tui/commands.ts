/**
 * The command line's commands: one typed table that drives parsing, Tab completion and the
 * help overlay. A command either says what it did or throws a CommandError (or an input
 * error from the session) that the command line shows inline; none can end the session
 * except `quit`.
 */
import { plural } from '../model/words.js';
import { closest } from '../expr/index.js';
import { InputError } from '../model/errors.js';
import { parseDuration } from '../model/units.js';
import type { LongOp } from '../session/long-op.js';
import type { Session, SessionStop } from '../session/session.js';
import { CommandError } from './command-error.js';
import { chartCommand, diffCommand } from './compare-commands.js';

export { CommandError } from './command-error.js';

/** What a command may act on: the session and the debugger around it. */
export interface CommandTarget {
  readonly session: Session;
  /** Tells the debugger the cursor moved (selections follow) and describes the stop. */
  moved(stop?: SessionStop): string;
  selectSite(site: string): void;
  /** Writes the replay file; throws when the debugger was opened without a file system. */
  saveReplay(path: string): void;
  /** Writes a text file (the chart); throws a CommandError when it cannot. */
  writeText(path: string, text: string): void;
  /** Reads a text file (a replay to compare with); throws a CommandError when it cannot. */
  readText(path: string): string;
  setAutoplay(rate: number | null): void;
  /** Starts a continue that runs in slices and reports when it stops. */
  continueForward(): void;
  /** Runs a long operation in slices (progress on the status line, Esc stops it); returns what to say now. */
  runLong(op: LongOp<SessionStop>): string;
  openList(): void;
  openHelp(): void;
  quit(): void;
}

/** What Tab completes after a command word. */
export type CompleteKind = 'site' | 'expr' | 'breakpoint' | 'id' | 'go' | 'none';

export interface CommandDef {
  readonly word: string;
  /** Arguments as shown in help, e.g. `EXPR`. */
  readonly args: string;
  readonly does: string;
  readonly complete: CompleteKind;
  /** Runs the command on the text after its word; returns one line saying what happened. */
  run(t: CommandTarget, rest: string): string;
}

function count(rest: string, word: string): number {
  if (rest === '') return 1;
  if (!/^[0-9]+$/.test(rest)) throw new CommandError(`${word} takes a number of events, got "${rest}"`, `write e.g. "${word} 10"`);
  return eventNumber(rest, word);
}

function id(rest: string, word: string): number {
  if (!/^[0-9]+$/.test(rest)) throw new CommandError(`${word} needs the number of a breakpoint or watch`, 'the list command shows the numbers');
  return Number(rest);
}

/** The largest event number a jump may name: beyond it, counts are not exact in the engine's numbers. */
export const MAX_EVENT = Number.MAX_SAFE_INTEGER - 1;

/** A whole number of events from text, refused when it is beyond what the engine can count. */
function eventNumber(text: string, word: string): number {
  const v = Number(text);
  if (!Number.isSafeInteger(v) || v > MAX_EVENT) {
    throw new CommandError(`${word}: ${text} is more events than bellstep can count (at most ${MAX_EVENT})`, `write a smaller number, or use a time, e.g. "${word} 2.5 ms"`);
  }
  return v;
}

function go(t: CommandTarget, rest: string): string {
  const s = t.session;
  if (rest === '') throw new CommandError('go needs an event number, a time, "start" or "end"', 'write e.g. "go 12", "go 2.5 ms" or "go start"');
  if (rest === 'start') return t.moved(s.goto(0));
  if (rest === 'end') return t.moved(s.goto(s.total));
  const n = /^#?([0-9]+)$/.exec(rest);
  // "go N" puts the cursor on event #N: the world after events 0..N
  if (n) return t.runLong(s.startGoto(eventNumber(n[1], 'go') + 1));
  let ns: number;
  try {
    ns = parseDuration(rest);
  } catch (e) {
    if (e instanceof InputError) throw new CommandError(`go: "${rest}" is neither an event number nor a time`, 'write e.g. "go 12" or "go 2.5 ms"');
    throw e;
  }
  if (!Number.isSafeInteger(ns)) throw new CommandError(`go: ${rest} is longer than bellstep can count in nanoseconds`, 'write a shorter time');
  return t.runLong(s.startGotoTime(ns));
}

/** Every command, in the order the help overlay lists them. */
export const COMMANDS: readonly CommandDef[] = [
  { word: 'go', args: 'N | TIME | start | end', does: 'jump to event #N or to the last event at or before a time (e.g. 2.5 ms)', complete: 'go', run: go },
  { word: 'step', args: '[N]', does: 'step N events forward (default 1)', complete: 'none', run: (t, r) => {
    const n = count(r, 'step');
    if (n === 1) {
      t.session.stepForward();
      return t.moved();
    }
    return t.runLong(t.session.startGoto(Math.min(MAX_EVENT, t.session.cursor + n)));
  } },
  { word: 'back', args: '[N]', does: 'step N events back (default 1)', complete: 'none', run: (t, r) => {
    const n = count(r, 'back');
    if (n === 1) {
      t.session.stepBack();
      return t.moved();
    }
    return t.runLong(t.session.startGoto(Math.max(0, t.session.cursor - n)));
  } },
  { word: 'continue', args: '', does: 'run forward to the next breakpoint hit, stall or end', complete: 'none', run: (t) => {
    t.continueForward();
    return 'running forward…';
  } },
  { word: 'rewind', args: '', does: 'run back to the previous breakpoint hit, or the start', complete: 'none', run: (t) => t.runLong(t.session.startReverse()) },
  { word: 'break', args: 'EXPR | on fire SITE.RULE | on send KIND | on deliver | on discard | on stall', does: 'add a breakpoint', complete: 'breakpoint', run: (t, r) => {
    if (!r) throw new CommandError('break needs a condition or an event form', 'write e.g. "break on fire mill.swap" or "break delivered() >= 2"');
    const bp = t.session.addBreakpoint(r);
    return `breakpoint ${bp.id}: ${bp.spec}`;
  } },
  { word: 'watch', args: 'EXPR', does: 'show the value of an expression at every event', complete: 'expr', run: (t, r) => {
    if (!r) throw new CommandError('watch needs an expression', 'write e.g. "watch pairs(mill)"');
    try {
      const w = t.session.addWatch(r);
      return `watch ${w.id}: ${w.spec}`;
    } catch (e) {
      if (e instanceof InputError) throw e;
      throw new CommandError(e instanceof Error ? e.message : String(e), 'a watch is an expression such as "pairs(mill)"; use break for event forms');
    }
  } },
  { word: 'forget', args: 'ID', does: 'remove a breakpoint or a watch', complete: 'id', run: (t, r) => {
    const n = id(r, 'forget');
    if (t.session.removeBreakpoint(n)) return `breakpoint ${n} removed`;
    if (t.session.removeWatch(n)) return `watch ${n} removed`;
    throw new CommandError(`there is no breakpoint or watch ${n}`, 'the list command shows the numbers');
  } },
  { word: 'disable', args: 'ID', does: 'keep a breakpoint but stop it from hitting', complete: 'id', run: (t, r) => {
    const n = id(r, 'disable');
    if (!t.session.enableBreakpoint(n, false)) throw new CommandError(`there is no breakpoint ${n}`, 'the list command shows the numbers');
    return `breakpoint ${n} disabled`;
  } },
  { word: 'enable', args: 'ID', does: 'let a disabled breakpoint hit again', complete: 'id', run: (t, r) => {
    const n = id(r, 'enable');
    if (!t.session.enableBreakpoint(n, true)) throw new CommandError(`there is no breakpoint ${n}`, 'the list command shows the numbers');
    return `breakpoint ${n} enabled`;
  } },
  { word: 'list', args: '', does: 'list the breakpoints and watches', complete: 'none', run: (t) => {
    t.openList();
    return 'breakpoints and watches';
  } },
  { word: 'site', args: 'SITE', does: 'select a site for the pairs and rules panes', complete: 'site', run: (t, r) => {
    const ids = t.session.engine.net.nodeIds;
    if (!ids.includes(r)) {
      const near = closest(r, ids);
      throw new CommandError(`there is no site "${r}"`, near ? `did you mean ${near}?` : `the sites are ${ids.join(', ')}`);
    }
    t.selectSite(r);
    return `site ${r} selected`;
  } },
  { word: 'save', args: 'FILE', does: 'write a replay file of everything computed so far', complete: 'none', run: (t, r) => {
    if (!r) throw new CommandError('save needs a file name', 'write e.g. "save stall.replay.json"');
    t.saveReplay(r);
    return `replay written to ${r}`;
  } },
  { word: 'chart', args: 'FILE', does: 'write a space-time chart (SVG) of every event computed so far', complete: 'none', run: chartCommand },
  { word: 'diff', args: 'FILE', does: 'compare the run with a replay file and go to the first event where they part', complete: 'none', run: diffCommand },
  { word: 'autoplay', args: 'RATE | off', does: 'step on its own at RATE events per second (Space pauses)', complete: 'none', run: (t, r) => {
    if (r === 'off') {
      t.setAutoplay(null);
      return 'autoplay off';
    }
    const rate = Number(r);
    if (!r || !Number.isFinite(rate) || rate <= 0 || rate > 100) throw new CommandError('autoplay needs a rate in events per second, up to 100, or "off"', 'write e.g. "autoplay 2"');
    t.setAutoplay(rate);
    return `autoplay at ${plural(rate, 'event')} per second`;
  } },
  { word: 'help', args: '', does: 'show the keys and commands', complete: 'none', run: (t) => {
    t.openHelp();
    return 'help';
  } },
  { word: 'quit', args: '', does: 'leave the debugger', complete: 'none', run: (t) => {
    t.quit();
    return 'bye';
  } },
];

/** The outcome of a command line: what it did, or what was wrong and how to fix it. */
export type CommandOutcome = { readonly ok: true; readonly said: string } | { readonly ok: false; readonly error: string; readonly fix?: string };

/** Splits a command line into its word and the rest. */
export function splitCommand(text: string): { word: string; rest: string } {
  const t = text.trim();
  const sp = t.search(/\s/);
  return sp < 0 ? { word: t, rest: '' } : { word: t.slice(0, sp), rest: t.slice(sp + 1).trim() };
}

/**
 * Runs one command line. Mistakes (unknown words, bad arguments, wrong expressions) come
 * back as an outcome; only errors that are bugs in bellstep propagate.
 */
export function runCommand(t: CommandTarget, text: string): CommandOutcome {
  const { word, rest } = splitCommand(text);
  if (!word) return { ok: false, error: 'type a command', fix: 'Tab lists the commands; ? shows them all' };
  const def = COMMANDS.find((c) => c.word === word);
  if (!def) {
    const near = closest(word, COMMANDS.map((c) => c.word));
    return { ok: false, error: `there is no command "${word}"`, fix: near ? `did you mean "${near}"?` : 'Tab lists the commands; ? shows them all' };
  }
  try {
    return { ok: true, said: def.run(t, rest) };
  } catch (e) {
    if (e instanceof CommandError) return { ok: false, error: e.message, fix: e.fix };
    if (e instanceof InputError) return { ok: false, error: e.message, fix: e.fix };
    throw e;
  }
}
