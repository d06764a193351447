/**
 * `bellstep debug`: the step-through debugger in the terminal (docs/cli.md). Inputs come
 * from the files or, with --replay, from the replay file; --at opens the cursor on an
 * event; --autoplay starts teaching mode. Without a terminal it points to `bellstep run`.
 */
import { inputsOf, type Inputs } from '../../api/inputs.js';
import { openSessionWith } from '../../api/session.js';
import { InputError } from '../../model/errors.js';
import { parseReplay } from '../../session/replay.js';
import { engineFromReplay } from '../../session/verify.js';
import { crashReplayPath, onCrashSaveReplay } from '../crash.js';
import { checkOutput, writeOutput, writeRegularFile } from '../outputs.js';
import type { CliIo } from '../io.js';
import { many, parseCount, parseSeed, readInput, readInputs } from '../inputs.js';
import { HISTORY_DEFAULTS, type HistoryOptions } from '../../session/history.js';
import { EXIT, type CommandSpec, type OptionSpec } from '../spec.js';

export interface OpenOptions {
  /** Breakpoints to add before the debugger opens. */
  readonly breaks: readonly string[];
  /** Event to open the cursor on (its index). */
  readonly at?: number;
  /** Teaching mode: events per second. */
  readonly autoplay?: number;
  /** The headless command that does the same job, for the no-terminal message. */
  readonly runHint: string;
  /** History bounds from --window and --history-mb. */
  readonly history?: HistoryOptions;
  /** The files the debugger was opened on, which `save` must never overwrite. */
  readonly inputFiles?: readonly (string | undefined)[];
  /** The seed (default: the noise model's). */
  readonly seed?: number;
}

/** Parses --window and --history-mb into history bounds (defaults in session/history.ts). */
export function parseHistory(opts: Readonly<Record<string, unknown>>): HistoryOptions {
  const window = parseCount(opts.window, '--window');
  const mb = parseCount(opts.historyMb, '--history-mb');
  return { window, budgetBytes: mb === undefined ? undefined : mb * 1024 * 1024 };
}

/** Parses `--autoplay`: events per second, more than 0 and at most 100. */
export function parseRate(v: unknown): number | undefined {
  if (v === undefined) return undefined;
  const s = String(v).trim();
  const n = Number(s);
  if (!/^[0-9]+(\.[0-9]+)?$/.test(s) || n <= 0 || n > 100) {
    throw new InputError({ code: 'usage', field: '--autoplay', message: `expected events per second (more than 0, at most 100), got "${s}"`, fix: 'write e.g. --autoplay 2' });
  }
  return n;
}

function parseAt(v: unknown): number | undefined {
  if (v === undefined) return undefined;
  const s = String(v).trim();
  if (!/^[0-9]+$/.test(s)) throw new InputError({ code: 'usage', field: '--at', message: `expected an event index (0 or more), got "${s}"`, fix: 'write e.g. --at 12' });
  return Number(s);
}

function ciSet(env: Readonly<Record<string, string | undefined>>, key: string): boolean {
  return env[key] !== undefined && env[key] !== '0' && env[key] !== 'false';
}

/** How the debugger writes a file (`save FILE`, `chart FILE`): with the checks of every output, never over one of its inputs. */
export function saveWriter(io: CliIo, inputs: readonly (string | undefined)[]): (path: string, text: string) => void {
  return (path, text) => {
    checkOutput(io, path, 'FILE', inputs, 'stall.replay.json');
    writeOutput(io, path, text, 'FILE');
  };
}

/** Opens the debugger on validated inputs once both streams are terminals; returns the exit code. */
export async function openDebugger(io: CliIo, inputs: Inputs, opts: OpenOptions): Promise<number> {
  // long operations run in slices of a few milliseconds between keys: the session is given the clock to time them
  const session = openSessionWith(inputs, { ...opts.history, seed: opts.seed, clock: () => performance.now() });
  for (const b of opts.breaks) session.addBreakpoint(b);
  if (!io.stdinIsTTY || !io.stdoutIsTTY) {
    io.stderr(
      `bellstep: the debugger needs an interactive terminal (${!io.stdinIsTTY ? 'stdin' : 'stdout'} is not one)\n` +
        `  fix: for a headless run, use: ${opts.runHint}\n`,
    );
    return EXIT.input;
  }
  // Ink draws nothing until exit when CI is set; with both streams on a terminal the
  // session is interactive whatever the shell says, so this process drops the flag
  // before Ink is loaded
  for (const key of ['CI', 'CONTINUOUS_INTEGRATION']) if (ciSet(process.env, key)) delete process.env[key];
  const { Controller, startDebugger, wantsColour } = await import('../../tui/index.js');
  const controller = new Controller(session, { colour: wantsColour(io.env), autoplay: opts.autoplay, writeFile: saveWriter(io, opts.inputFiles ?? []), readFile: (p) => readInput(io, p, 'replay file') });
  // a far --at is a long jump: it runs in slices once the screen is up, with its progress shown
  if (opts.at !== undefined) controller.runLong(session.startGoto(opts.at + 1));
  onCrashSaveReplay((why) => {
    const path = crashReplayPath(io);
    writeRegularFile(io, path, session.exportReplay({ reason: 'crash', detail: `automatic replay after an internal error in the debugger: ${why}` }));
    return path;
  });
  // on a crash this throws with the hook still set, so the CLI's report can save the replay
  await startDebugger(controller, { stdin: process.stdin, stdout: process.stdout, stderr: process.stderr });
  onCrashSaveReplay(undefined);
  return EXIT.ok;
}

export const DEBUG_OPTIONS: readonly OptionSpec[] = [
  { flags: '--noise <N.yaml>', description: 'noise model (default: ideal)' },
  { flags: '--seed <S>', description: "seed (overrides the noise model's)" },
  { flags: '--break <EXPR>', description: 'add a breakpoint before opening (repeatable)', repeatable: true },
  { flags: '--replay <R.json>', description: 'open a replay file: its embedded inputs, seed and breakpoints' },
  { flags: '--at <I>', description: 'with --replay: open with the cursor on event I' },
  { flags: '--autoplay <RATE>', description: 'teaching mode: step RATE events per second, narrating each (Space pauses)' },
  { flags: '--window <N>', description: `events near the cursor whose worlds are at hand (every fourth held, the rest a few steps away), at least N and at most 2N (default ${HISTORY_DEFAULTS.window})` },
  { flags: '--history-mb <MB>', description: `memory kept for rewind (records, recent worlds, keyframes); beyond it keyframes far from the cursor are thinned (default ${HISTORY_DEFAULTS.budgetBytes / 1024 / 1024})` },
];

export const debugCommand: CommandSpec = {
  name: 'debug',
  args: '[NET.yaml]',
  summary: 'step through a run in the terminal: panes, breakpoints, rewind (needs a terminal)',
  options: DEBUG_OPTIONS,
  async run({ io }, [netPath], opts) {
    const seedFlag = parseSeed(opts.seed);
    const autoplay = parseRate(opts.autoplay);
    const at = parseAt(opts.at);
    const breaks = many(opts.break);
    if (opts.replay !== undefined) {
      const path = String(opts.replay);
      const replay = parseReplay(readInput(io, path, 'replay file'), path);
      if (seedFlag !== undefined && seedFlag !== replay.seed) {
        throw new InputError({ code: 'usage', field: '--seed', message: `the replay was recorded with seed ${replay.seed}`, fix: 'leave out --seed with --replay' });
      }
      if (netPath !== undefined && readInput(io, netPath, 'program set') !== replay.inputs.program_set.text) {
        io.stderr(`bellstep: note: ${netPath} differs from the program set recorded in ${path}; the debugger uses the recorded one\n`);
      }
      if (at !== undefined && at >= replay.events.length) {
        throw new InputError({ code: 'usage', field: '--at', message: `the replay holds events 0 to ${replay.events.length - 1}, not ${at}`, fix: `write --at ${Math.max(0, replay.events.length - 1)} or less` });
      }
      const { programSet, noise } = engineFromReplay(replay).net;
      return openDebugger(io, inputsOf(programSet, noise), { breaks: [...replay.breakpoints, ...breaks], at, autoplay, runHint: `bellstep replay ${path} --verify`, history: parseHistory(opts), seed: replay.seed, inputFiles: [path, netPath] });
    }
    if (netPath === undefined) {
      throw new InputError({ code: 'usage', field: 'NET.yaml', message: 'debug needs a program set or --replay', fix: 'write e.g. bellstep debug swap.net.yaml --noise swap.noise.yaml' });
    }
    if (at !== undefined) throw new InputError({ code: 'usage', field: '--at', message: '--at needs --replay', fix: 'to open at an event of a fresh run, use the command "go N" inside the debugger' });
    const inputs = readInputs(io, netPath, opts.noise as string | undefined);
    const hint = ['bellstep run', netPath, ...(opts.noise ? ['--noise', String(opts.noise)] : []), ...(seedFlag !== undefined ? ['--seed', String(seedFlag)] : []), ...breaks.map((b) => `--break "${b}"`)].join(' ');
    return openDebugger(io, inputs, { breaks, autoplay, runHint: hint, history: parseHistory(opts), seed: seedFlag, inputFiles: [netPath, opts.noise as string | undefined] });
  },
};
