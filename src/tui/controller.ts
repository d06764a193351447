/**
 * The debugger's state and every action a key or command can take, without React: the
 * session, which pane has focus, the selected site, pair and event, scroll positions, the
 * command line, overlays and autoplay. Ink components only render what this holds and send
 * it key presses, so the whole debugger can be driven and checked headless.
 */
import type { Key } from 'ink';
import { ProgramError } from '../engine/index.js';
import { BreakpointError } from '../session/breakpoints.js';
import type { LongOp } from '../session/long-op.js';
import type { Session, SessionStop } from '../session/session.js';
import { formatDuration } from '../model/units.js';
import { CommandError, runCommand, type CommandTarget } from './commands.js';
import { complete } from './complete.js';
import { EventLog } from './event-log.js';
import { keyAction, splitKeys, type KeyAction } from './keys.js';
import { PANES, type PaneId } from './layout.js';
import type { Tone } from './lines.js';
import { chainOrder } from './views/network.js';
import { pairsAt } from './views/pairs.js';

export interface ControllerOptions {
  /** Colour on (false under NO_COLOR). */
  readonly colour?: boolean;
  /** Start in teaching mode, stepping this many events per second. */
  readonly autoplay?: number;
  /** Writes a file (the `save` and `chart` commands); absent, they say they cannot. */
  readonly writeFile?: (path: string, text: string) => void;
  /** Reads a file (the `diff` command); absent, it says it cannot. */
  readonly readFile?: (path: string) => string;
  /** Runs long work after the "running…" frame is drawn (default setImmediate). */
  readonly defer?: (fn: () => void) => void;
  /** Whole events kept for the timeline. */
  readonly logCapacity?: number;
}

export type Mode = 'normal' | 'command' | 'help' | 'list';

/** Milliseconds of work per slice of a long operation: keys are read between slices. */
const SLICE_MS = 12;

export interface Note {
  readonly lines: readonly string[];
  readonly tone: Tone;
}

export interface CommandLine {
  text: string;
  /** Completion candidates, or the error of the last attempt. */
  hint?: Note;
}

export class Controller implements CommandTarget {
  readonly log: EventLog;
  readonly colour: boolean;
  /** Bumped on every change; panes cache their lines by it. */
  version = 0;
  focus: PaneId = 'network';
  site: string;
  mode: Mode = 'normal';
  note?: Note;
  /** Set while a long continue runs. */
  busy?: string;
  pairSel = 0;
  readonly bellOpen = new Set<number>();
  /** The selected event in the events pane; null follows the cursor. */
  eventSel: number | null = null;
  /** Scroll offsets of the text panes (for the timeline: rows back from the cursor). */
  readonly scroll: Record<PaneId, number> = { network: 0, pairs: 0, rules: 0, messages: 0, events: 0, timeline: 0 };
  overlayScroll = 0;
  readonly command: CommandLine = { text: '' };
  autoplay: { rate: number; playing: boolean } | null;
  /** Page height of the focused pane, set by the frame builder for PgUp/PgDn. */
  pageRows = 10;
  private readonly listeners = new Set<() => void>();
  private readonly history: string[] = [];
  private historyAt = 0;
  private readonly defer: (fn: () => void) => void;
  private exitFn?: (error?: Error) => void;
  ended = false;

  constructor(
    readonly session: Session,
    private readonly opts: ControllerOptions = {},
  ) {
    this.log = new EventLog(session, opts.logCapacity);
    this.colour = opts.colour ?? true;
    this.defer = opts.defer ?? ((fn) => void setImmediate(fn));
    const net = session.engine.net;
    this.site = net.nodeIds.find((id) => (net.rules.get(id)?.length ?? 0) > 0) ?? net.nodeIds[0];
    this.autoplay = opts.autoplay ? { rate: opts.autoplay, playing: true } : null;
  }

  /** Calls `fn` after every change; returns the unsubscribe function. */
  subscribe(fn: () => void): () => void {
    this.listeners.add(fn);
    return () => void this.listeners.delete(fn);
  }

  /** Sets how the debugger ends: `exit()` on quit, `exit(error)` on a crash. */
  onExit(fn: (error?: Error) => void): void {
    this.exitFn = fn;
  }

  private changed(): void {
    this.version++;
    for (const fn of this.listeners) fn();
  }

  private say(text: string | readonly string[], tone: Tone = 'plain'): void {
    this.note = { lines: typeof text === 'string' ? [text] : text, tone };
  }

  /** Runs an action; mistakes in programs or breakpoints become notes, anything else ends the debugger as a crash. */
  private guarded(fn: () => void): void {
    try {
      fn();
    } catch (e) {
      if (e instanceof ProgramError) {
        e.traced(this.session.engine.net.rules);
        this.say(['program error: ' + e.format().split('\n')[0], ...(e.fix ? [`fix: ${e.fix}`] : [])], 'bad');
      }
      else if (e instanceof BreakpointError) this.say([e.message, 'fix: disable or forget that breakpoint (list shows them)'], 'bad');
      else {
        this.crash(e instanceof Error ? e : new Error(String(e)));
        return;
      }
    }
    this.changed();
  }

  /** Ends the debugger with an internal error (the CLI restores the terminal and writes the automatic replay). */
  crash(error: Error): void {
    this.ended = true;
    if (this.exitFn) this.exitFn(error);
    else throw error;
  }

  quit(): void {
    this.ended = true;
    this.exitFn?.();
  }

  // ------------------------------------------------------------------ cursor moves

  /** After the cursor moved: selections follow it and the stop is described. */
  moved(stop: SessionStop = this.session.stop): string {
    this.eventSel = null;
    this.scroll.timeline = 0;
    const n = pairsAt(this.session.engine.net, this.session.world(), this.site).length;
    this.pairSel = Math.min(this.pairSel, Math.max(0, n - 1));
    const c = this.session.cursor;
    return `${c === 0 ? 'at the start' : `at event #${c - 1}`}: ${stop.detail}`;
  }

  private move(fn: () => SessionStop | boolean, quiet = false): void {
    const r = fn();
    const text = this.moved(typeof r === 'boolean' ? this.session.stop : r);
    if (!quiet || typeof r !== 'boolean' || !r) this.say(text, this.stopTone());
    else this.note = undefined;
  }

  private stopTone(): Tone {
    const s = this.session.stop.reason;
    return s === 'stall' ? 'bad' : s === 'breakpoint' ? 'accent' : s === 'idle' || s === 'limit' ? 'warn' : 'plain';
  }

  /** The long operation running in slices, if any (see session/long-op.ts). */
  private op?: { run: LongOp<SessionStop>; started: number; lastDraw: number };

  /**
   * Runs a long operation (a far jump, a continue, a search back) in slices of a few
   * milliseconds, handing the event loop back between them so keys and resizes are handled:
   * the status line shows its progress, Esc stops it where it has got to, q quits.
   */
  runLong(run: LongOp<SessionStop>): string {
    if (this.op) throw new CommandError('something is already running', 'wait for it, or press Esc to stop it');
    this.op = { run, started: performance.now(), lastDraw: 0 };
    this.busy = `${run.progress.label}…`;
    this.changed();
    this.defer(() => this.slice());
    // what it did is said when it ends (or, while it runs, on the status line)
    return '';
  }

  /** Events per second and the estimate left, from what a long operation has done so far. */
  private progressText(): string {
    const op = this.op!;
    const p = op.run.progress;
    const secs = (performance.now() - op.started) / 1000;
    const rate = secs > 0.05 ? p.done / secs : 0;
    const parts = [`${p.label}: ${p.done.toLocaleString('en')} events done`];
    if (p.total !== null) parts[0] += `, ${Math.max(0, p.total - p.done).toLocaleString('en')} left`;
    parts.push(`simulated ${formatDuration(p.time)}`);
    if (rate > 0) parts.push(`${Math.round(rate).toLocaleString('en')} events/s`);
    if (rate > 0 && p.total !== null) parts.push(`about ${((p.total - p.done) / rate).toFixed(1)} s left`);
    return parts.join(' · ');
  }

  private slice(): void {
    const op = this.op;
    if (!op || this.ended) return;
    let stop: SessionStop | undefined;
    try {
      stop = op.run.run(SLICE_MS);
    } catch (e) {
      this.op = undefined;
      this.busy = undefined;
      this.guarded(() => {
        throw e;
      });
      return;
    }
    if (!stop) {
      const now = performance.now();
      // the status line is redrawn four times a second, not after every slice: a frame costs
      // about as much as a slice of work
      if (now - op.lastDraw > 250) {
        op.lastDraw = now;
        this.busy = this.progressText();
        this.changed();
      }
      this.defer(() => this.slice());
      return;
    }
    this.finishLong(stop);
  }

  private finishLong(stop: SessionStop): void {
    const op = this.op;
    this.op = undefined;
    this.busy = undefined;
    this.guarded(() => this.move(() => stop));
    // a long one says how long it took, so a person (or a benchmark) need not time it
    const secs = op ? (performance.now() - op.started) / 1000 : 0;
    const note = this.note;
    if (op && secs >= 0.5 && note && note.lines.length > 0) {
      const took = `(${op.run.progress.done.toLocaleString('en')} events in ${secs.toFixed(2)} s)`;
      this.note = { ...note, lines: [`${note.lines[0]} ${took}`, ...note.lines.slice(1)] };
    }
  }

  /** Stops the long operation where it has got to (Esc). */
  cancelLong(): void {
    const op = this.op;
    if (!op) return;
    this.guarded(() => this.finishLong(op.run.cancel()));
  }

  /** Continues in slices, so the count on screen moves and Esc stops the run. */
  continueForward(): void {
    if (this.op) return;
    this.guarded(() => void this.runLong(this.session.startContinue()));
  }

  /** One autoplay tick: a step, pausing at the end of the run. */
  autoStep(): void {
    if (!this.autoplay?.playing || this.busy || this.mode !== 'normal') return;
    this.guarded(() => {
      if (!this.session.stepForward()) {
        this.autoplay = { ...this.autoplay!, playing: false };
        this.move(() => this.session.stop);
      } else this.moved();
    });
  }

  setAutoplay(rate: number | null): void {
    this.autoplay = rate === null ? null : { rate, playing: true };
  }

  // ------------------------------------------------------------------ selection

  selectSite(site: string): void {
    if (site === this.site) return;
    this.site = site;
    this.pairSel = 0;
    this.bellOpen.clear();
    this.scroll.rules = 0;
    this.scroll.pairs = 0;
  }

  private moveSelection(delta: number): void {
    const s = this.session;
    switch (this.focus) {
      case 'network': {
        const order = chainOrder(s.engine.net) ?? [...s.engine.net.nodeIds];
        const i = order.indexOf(this.site);
        this.selectSite(order[Math.min(order.length - 1, Math.max(0, i + delta))]);
        return;
      }
      case 'pairs': {
        const n = pairsAt(s.engine.net, s.world(), this.site).length;
        this.pairSel = Math.min(Math.max(0, n - 1), Math.max(0, this.pairSel + delta));
        return;
      }
      case 'events': {
        const total = s.history.frontier;
        const from = this.eventSel ?? Math.max(0, s.cursor - 1);
        this.eventSel = Math.min(Math.max(0, total - 1), Math.max(0, from + delta));
        return;
      }
      case 'timeline':
        // up goes back in time
        this.scroll.timeline = Math.min(Math.max(0, s.cursor - 1), Math.max(0, this.scroll.timeline - delta));
        return;
      default:
        this.scroll[this.focus] = Math.max(0, this.scroll[this.focus] + delta);
    }
  }

  private activate(): void {
    const s = this.session;
    if (this.focus === 'pairs') {
      const rows = pairsAt(s.engine.net, s.world(), this.site);
      const q = rows[this.pairSel]?.qubit;
      if (q) {
        if (this.bellOpen.has(q)) this.bellOpen.delete(q);
        else this.bellOpen.add(q);
      }
    } else if (this.focus === 'events' && this.eventSel !== null) {
      const target = this.eventSel;
      this.move(() => s.goto(target + 1));
    } else if (this.focus === 'network') this.focus = 'rules';
  }

  // ------------------------------------------------------------------ keys

  /** Handles what Ink hands over: one key, or text that arrived in one piece (split into keys). */
  handleKey(input: string, key: Key): void {
    for (const [i, k] of splitKeys(input, key)) this.handleOneKey(i, k);
  }

  private handleOneKey(input: string, key: Key): void {
    if (this.ended) return;
    if (this.op) {
      // while something long runs: q or Ctrl+C quit at once, Esc stops it, anything else waits
      if ((input === 'c' && key.ctrl) || (input === 'q' && !key.ctrl && this.mode !== 'command')) this.quit();
      else if (key.escape) this.cancelLong();
      return;
    }
    if (this.mode === 'command') return this.commandKey(input, key);
    const action = keyAction(input, key);
    if (this.mode === 'help' || this.mode === 'list') return this.overlayKey(action);
    if (action) this.act(action);
  }

  private overlayKey(action: KeyAction | undefined): void {
    if (action === 'up' || action === 'down' || action === 'pageUp' || action === 'pageDown') {
      const d = action === 'up' ? -1 : action === 'down' ? 1 : action === 'pageUp' ? -this.pageRows : this.pageRows;
      this.overlayScroll = Math.max(0, this.overlayScroll + d);
    } else if (action === 'quit' || action === 'close' || action === 'help' || action === 'enter') this.mode = 'normal';
    this.changed();
  }

  /** Does what a key of the key table says. */
  act(action: KeyAction): void {
    const s = this.session;
    switch (action) {
      case 'step':
        return this.guarded(() => this.move(() => s.stepForward(), true));
      case 'back':
        return this.guarded(() => this.move(() => s.stepBack(), true));
      case 'continue':
        return this.continueForward();
      case 'reverse':
        return this.guarded(() => void this.runLong(s.startReverse()));
      case 'first':
        return this.guarded(() => this.move(() => s.goto(0)));
      case 'last':
        return this.guarded(() => this.move(() => s.goto(s.total)));
      case 'up':
      case 'down':
        return this.guarded(() => this.moveSelection(action === 'up' ? -1 : 1));
      case 'pageUp':
      case 'pageDown':
        return this.guarded(() => this.moveSelection(action === 'pageUp' ? -this.pageRows : this.pageRows));
      case 'enter':
        return this.guarded(() => this.activate());
      case 'focusNext':
      case 'focusPrev': {
        const i = PANES.indexOf(this.focus);
        this.focus = PANES[(i + (action === 'focusNext' ? 1 : PANES.length - 1)) % PANES.length];
        return this.changed();
      }
      case 'play':
        this.autoplay = this.autoplay ? { ...this.autoplay, playing: !this.autoplay.playing } : { rate: 1, playing: true };
        this.say(this.autoplay.playing ? `autoplay: ${this.autoplay.rate} events per second (Space pauses)` : 'autoplay paused (Space resumes)');
        return this.changed();
      case 'command':
      case 'goto':
        this.mode = 'command';
        this.command.text = action === 'goto' ? 'go ' : '';
        this.command.hint = undefined;
        this.historyAt = this.history.length;
        return this.changed();
      case 'help':
        return this.openHelp();
      case 'close':
        this.note = undefined;
        return this.changed();
      case 'quit':
        return this.quit();
    }
  }

  // ------------------------------------------------------------------ command line

  private commandKey(input: string, key: Key): void {
    const c = this.command;
    if (key.escape) {
      this.mode = 'normal';
      c.text = '';
    } else if (key.return) {
      this.submit();
      return;
    } else if (key.tab) {
      const done = complete(this.session, c.text);
      c.text = done.text;
      c.hint = done.options.length ? { lines: [done.options.join('  ')], tone: 'dim' } : undefined;
    } else if (key.backspace || key.delete) {
      c.text = [...c.text].slice(0, -1).join('');
    } else if (key.upArrow || key.downArrow) {
      this.historyAt = Math.min(this.history.length, Math.max(0, this.historyAt + (key.upArrow ? -1 : 1)));
      c.text = this.history[this.historyAt] ?? '';
    } else if (input === 'c' && key.ctrl) {
      return this.quit();
    } else if (input && !key.ctrl && !key.meta) {
      // typed or pasted text; control characters are dropped, and a pasted line break runs the line
      const nl = input.search(/[\r\n]/);
      c.text += [...(nl < 0 ? input : input.slice(0, nl))].filter((ch) => ch >= ' ' && ch !== '\u007f').join('');
      if (nl >= 0) return this.submit();
    }
    this.changed();
  }

  /** Runs the command line's text (also used by tests). */
  submit(text = this.command.text): void {
    const c = this.command;
    const line = text.trim();
    if (line) {
      this.history.push(line);
      this.historyAt = this.history.length;
    }
    this.mode = 'normal';
    this.guarded(() => {
      const out = runCommand(this, line);
      if (out.ok) {
        c.text = '';
        c.hint = undefined;
        if (!this.ended && this.mode === 'normal' && out.said) this.say(out.said, this.stopToneFor(line));
      } else {
        // a mistake keeps the line open, with the error under it
        this.mode = 'command';
        c.text = line;
        c.hint = { lines: [out.error, ...(out.fix ? [`fix: ${out.fix}`] : [])], tone: 'bad' };
      }
    });
  }

  private stopToneFor(line: string): Tone {
    return /^(go|step|back|continue|rewind)\b/.test(line) ? this.stopTone() : 'good';
  }

  saveReplay(path: string): void {
    if (!this.opts.writeFile) throw new CommandError('this debugger cannot write files', 'open it with bellstep debug to save replays');
    try {
      this.opts.writeFile(path, this.session.exportReplay());
    } catch (e) {
      throw new CommandError(`could not write ${path}: ${e instanceof Error ? e.message : String(e)}`, 'give a path to a regular file in a folder you can write');
    }
  }

  writeText(path: string, text: string): void {
    if (!this.opts.writeFile) throw new CommandError('this debugger cannot write files', 'open it with bellstep debug to write files');
    try {
      this.opts.writeFile(path, text);
    } catch (e) {
      throw new CommandError(`could not write ${path}: ${e instanceof Error ? e.message : String(e)}`, 'check the folder exists and is writable');
    }
  }

  readText(path: string): string {
    if (!this.opts.readFile) throw new CommandError('this debugger cannot read files', 'open it with bellstep debug to compare with a replay file');
    try {
      return this.opts.readFile(path);
    } catch (e) {
      throw new CommandError(`could not read ${path}: ${e instanceof Error ? e.message : String(e)}`, 'check the path of the replay file');
    }
  }

  openList(): void {
    this.mode = 'list';
    this.overlayScroll = 0;
    this.changed();
  }

  openHelp(): void {
    this.mode = this.mode === 'help' ? 'normal' : 'help';
    this.overlayScroll = 0;
    this.changed();
  }
}
