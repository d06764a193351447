/**
 * `replay --verify`: re-run a replay file's embedded inputs and compare every event with the
 * recording; report the first divergent event. The engine is deterministic, so any
 * difference means the engine or its inputs changed.
 */
import { Engine, ProgramError, quiescence, type World } from '../engine/index.js';
import { loadInputs } from '../model/index.js';
import { DigestChain, type ReplayEvent, type ReplayFile } from './replay.js';
import { checkExpectations, parseExpectation } from './run.js';
import type { ExpectationResult } from './summary.js';

export interface Divergence {
  /** Index of the first event that differs. */
  index: number;
  /** Which field differs first (`digest` when only the world after the event differs). */
  field: keyof ReplayEvent | 'missing' | 'extra';
  recorded: string | number | null;
  rerun: string | number | null;
  message: string;
}

export interface VerifyResult {
  ok: boolean;
  checked: number;
  divergence: Divergence | null;
  expectations: ExpectationResult[];
}

/** The engine and inputs a replay file embeds. */
export function engineFromReplay(r: ReplayFile): Engine {
  const { programSet, noise } = loadInputs({
    netFile: r.inputs.program_set.file,
    netText: r.inputs.program_set.text,
    noiseFile: r.inputs.noise?.file,
    noiseText: r.inputs.noise?.text,
    seed: r.seed,
  });
  return new Engine(programSet, noise);
}

const FIELDS: (keyof ReplayEvent)[] = ['index', 'time_ns', 'node', 'kind', 'summary', 'digest'];

function compare(rec: ReplayEvent, got: ReplayEvent): Divergence | null {
  for (const f of FIELDS) {
    if (rec[f] !== got[f]) {
      const what = f === 'digest' ? 'the world after it differs' : `${f} differs`;
      return {
        index: rec.index,
        field: f,
        recorded: rec[f],
        rerun: got[f],
        message: `event ${rec.index}: ${what} (recorded ${JSON.stringify(rec[f])}, re-run ${JSON.stringify(got[f])})`,
      };
    }
  }
  return null;
}

/** Re-runs a parsed (already validated) replay and compares it event by event. */
export function verifyReplay(r: ReplayFile): VerifyResult {
  const engine = engineFromReplay(r);
  try {
    return compareRun(engine, r);
  } catch (e) {
    throw e instanceof ProgramError ? e.traced(engine.net.rules) : e;
  }
}

function compareRun(engine: Engine, r: ReplayFile): VerifyResult {
  let world: World = engine.initial(r.seed);
  const chain = new DigestChain();
  let divergence: Divergence | null = null;
  let checked = 0;
  const total = r.events.length;
  while (!divergence && checked < total) {
    const res = engine.advance(world, Math.min(2048, total - checked), {
      after: (ev, d) => {
        divergence = compare(r.events[checked], chain.next(ev, d));
        if (!divergence) checked++;
        return divergence !== null;
      },
    });
    world = res.world;
    if (!divergence && res.exhausted && checked < total) {
      const rec = r.events[checked];
      divergence = {
        index: rec.index,
        field: 'missing',
        recorded: rec.summary,
        rerun: null,
        message: `event ${rec.index}: the re-run has no more events (it went ${quiescence(world)}), the recording has "${rec.summary}"`,
      };
    }
  }
  if (!divergence && (r.stop.reason === 'stall' || r.stop.reason === 'idle')) {
    const more = engine.advance(world, 1);
    if (more.events.length > 0) {
      const ev = more.events[0];
      divergence = {
        index: ev.index,
        field: 'extra',
        recorded: null,
        rerun: ev.summary,
        message: `event ${ev.index}: the recording ended (${r.stop.reason}) but the re-run goes on with "${ev.summary}"`,
      };
    }
  }
  const expectations = checkExpectations(engine, world, r.expectations.map((e) => parseExpectation(e)));
  return { ok: divergence === null, checked, divergence, expectations };
}
