/**
 * Re-simulating a recorded run. Replay files hold one-line event texts, not the sends,
 * swaps and pairs a chart or a comparison needs, so both re-run the embedded inputs and
 * check every event against the recording on the way, as `replay --verify` does: a chart
 * or a diff of a run this version does not reproduce would be a picture of another run.
 */
import { ProgramError, type Engine, type EngineEvent, type World } from '../engine/index.js';
import { InputError } from '../model/errors.js';
import { DigestChain, digestVersion, parseReplay, type ReplayEvent, type ReplayFile } from '../session/replay.js';
import { engineFromReplay } from '../session/verify.js';

/** A run as recorded: the engine of its inputs, its seed and its event records. */
export interface RecordedRun {
  /** How messages name the run: its file, or "the session". */
  readonly name: string;
  readonly engine: Engine;
  readonly seed: number;
  /** Its event records (a replay file's columns, or the session's). */
  readonly events: RecordedEvents;
  /** Which digest its records carry (1 for `@1` files, 2 otherwise). */
  readonly digestVersion?: 1 | 2;
}

/** Recorded events as a re-run reads them: one at a time, with their time and digest. */
export interface RecordedEvents {
  readonly length: number;
  time(i: number): number;
  digest(i: number): string;
}

/** A replay file's run, through the session's replay loader (any replay version it reads). */
export function recordedRun(name: string, r: ReplayFile): RecordedRun {
  return { name, engine: engineFromReplay(r), seed: r.seed, events: r.events, digestVersion: digestVersion(r.format) };
}

/** Parses a replay file's text and gives its run; bad files are input errors naming `name`. */
export function loadRecordedRun(name: string, text: string): { run: RecordedRun; replay: ReplayFile } {
  const replay = parseReplay(text, name);
  return { run: recordedRun(name, replay), replay };
}

/** Events applied per `advance` call. */
const BATCH = 4096;

/** A re-run in progress: the world after `done` events, every one of them checked against the recording. */
export class Rerun {
  world: World;
  done = 0;
  private readonly chain: DigestChain;

  constructor(readonly run: RecordedRun) {
    this.chain = new DigestChain(run.digestVersion ?? 2);
    this.world = run.engine.initial(run.seed);
  }

  /**
   * Applies the recorded events up to (not including) index `n`. `visit` sees each event and
   * the working world after it; `detail` asks for the action phrases of rule firings.
   */
  to(n: number, detail: boolean, visit?: (ev: EngineEvent, w: World) => void): World {
    const { engine, events, name } = this.run;
    const target = Math.min(n, events.length);
    try {
      while (this.done < target) {
        const res = engine.advance(
          this.world,
          Math.min(BATCH, target - this.done),
          {
            after: (ev, d) => {
              const i = this.done;
              const got = this.chain.next(ev, d);
              if (got.time_ns !== events.time(i) || got.digest !== events.digest(i)) throw mismatch(name, i, events.time(i), got);
              this.done++;
              visit?.(ev, d);
              return false;
            },
          },
          { keep: 'none', detail },
        );
        this.world = res.world;
        if (res.exhausted && this.done < target) throw ended(name, this.done);
      }
    } catch (e) {
      throw e instanceof ProgramError ? e.traced(engine.net.rules) : e;
    }
    return this.world;
  }
}

function mismatch(file: string, index: number, recorded: number, got: ReplayEvent): InputError {
  const what = got.time_ns !== recorded ? `it happens at ${got.time_ns} ns, not ${recorded} ns` : 'the world after it differs';
  return new InputError({
    code: 'replay',
    file,
    field: `events[${index}]`,
    message: `event ${index} does not re-run as recorded (${what}), so this bellstep cannot draw or compare the run`,
    fix: `\`bellstep replay ${file} --verify\` shows where it parts; record the run again with this version`,
  });
}

function ended(file: string, index: number): InputError {
  return new InputError({
    code: 'replay',
    file,
    field: `events[${index}]`,
    message: `the re-run has no event ${index}, which the recording holds`,
    fix: `\`bellstep replay ${file} --verify\` shows where it parts; record the run again with this version`,
  });
}
