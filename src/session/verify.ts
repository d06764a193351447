/**
 * `replay --verify`: re-run a replay file's embedded inputs and compare every event with the
 * recording, then check that the re-run ends where the recording says it ended: the same
 * event count, for the same reason, with the same last digest. The engine is deterministic,
 * so any difference means the engine, the inputs or the file changed. A file with events
 * removed, cut short or emptied and then re-signed never verifies, since its stop no longer
 * matches what the run does.
 */
import { Engine, ProgramError, quiescence, type EngineEvent, type World } from '../engine/index.js';
import { loadInputs } from '../model/index.js';
import { formatDuration, parseDuration } from '../model/units.js';
import { breakpointScanner, parseBreakpoint } from './breakpoints.js';
import { DigestChain, digestVersion, type ReplayEvent, type ReplayFile } from './replay.js';
import { checkExpectations, parseExpectation } from './run.js';
import type { ExpectationResult } from './summary.js';

export interface Divergence {
  /** Index of the first event that differs (for a stop that differs, the event count where it does). */
  index: number;
  /** Which field differs first (`digest` when only the world after the event differs; `stop` when the run ends elsewhere). */
  field: keyof ReplayEvent | 'missing' | 'extra' | 'stop';
  recorded: string | number | null;
  rerun: string | number | null;
  message: string;
}

export interface VerifyResult {
  ok: boolean;
  checked: number;
  divergence: Divergence | null;
  expectations: ExpectationResult[];
  /** True for the automatic replay of a crashed run: verified up to its last event, and no further. */
  partial: boolean;
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

/** Compares re-run event i with the recording (digest given as halves); null when they agree. */
function compare(r: ReplayFile, i: number, ev: EngineEvent, hi: number, lo: number): Divergence | null {
  const e = r.events;
  // the cheap checks first, as numbers; text only when something differs
  const [rhi, rlo] = e.digestHalves(i);
  const summary = e.summary(i);
  if (e.time(i) === ev.time && rhi === hi && rlo === lo && e.node(i) === ev.node && e.kind(i) === ev.type && (summary === null || summary === ev.summary)) return null;
  const digest = (hi >>> 0).toString(16).padStart(8, '0') + (lo >>> 0).toString(16).padStart(8, '0');
  const pairs: [keyof ReplayEvent, string | number | null, string | number | null][] = [
    ['index', i, ev.index],
    ['time_ns', e.time(i), ev.time],
    ['node', e.node(i), ev.node],
    ['kind', e.kind(i), ev.type],
  ];
  if (summary !== null) pairs.push(['summary', summary, ev.summary]);
  pairs.push(['digest', e.digest(i), digest]);
  for (const [f, recorded, rerun] of pairs) {
    if (recorded !== rerun) {
      const what = f === 'digest' ? 'the world after it differs' : `${f} differs`;
      return { index: i, field: f, recorded, rerun, message: `event ${i}: ${what} (recorded ${JSON.stringify(recorded)}, re-run ${JSON.stringify(rerun)})` };
    }
  }
  return null;
}

function stopMismatch(count: number, message: string, recorded: string | number | null, rerun: string | number | null): Divergence {
  return { index: count, field: 'stop', recorded, rerun, message };
}

/** What an `@1` file's stop detail says about its limit (those files did not record limits). */
function v1Limits(r: ReplayFile): { events?: number; untilNs?: number } {
  const d = r.stop.detail;
  const ev = /^reached the event limit \((\d+)\)$/.exec(d);
  if (r.stop.reason === 'events' && ev) return { events: Number(ev[1]) };
  const until = /is after --until (.+)$/.exec(d);
  if (r.stop.reason === 'until' && until) {
    try {
      return { untilNs: parseDuration(until[1]) };
    } catch {
      return {};
    }
  }
  return {};
}

/**
 * Re-runs a parsed (already validated) replay, compares it event by event, and checks that
 * the re-run stops where the recording stopped.
 */
export function verifyReplay(r: ReplayFile): VerifyResult {
  const engine = engineFromReplay(r);
  try {
    return verifyWith(engine, r);
  } catch (e) {
    // a program error names the rule; one from a role also names where the role is written
    throw e instanceof ProgramError ? e.traced(engine.net.rules) : e;
  }
}

function verifyWith(engine: Engine, r: ReplayFile): VerifyResult {
  const net = engine.net;
  let world: World = engine.initial(r.seed);
  const chain = new DigestChain(digestVersion(r.format));
  const total = r.events.length;
  let divergence: Divergence | null = null;
  let checked = 0;
  const breakpoints = r.breakpoints.map((b, i) => parseBreakpoint(net, b, i + 1, 'breakpoints'));
  const active = breakpoints.filter((b) => b.kind !== 'stall');
  const scan = active.length ? breakpointScanner(net, active, world) : undefined;
  /** The event after which a breakpoint of the file hit in the re-run, if one did. */
  let hitAt = -1;
  // the whole recording in one working copy, then (at most) one more event to see where the run goes
  const res = engine.advance(
    world,
    total,
    {
      after: (ev, d) => {
        chain.advance(ev, d);
        divergence = compare(r, checked, ev, chain.hi, chain.lo);
        if (divergence) return true;
        checked++;
        if (scan !== undefined && scan(ev, d) !== undefined && hitAt < 0) hitAt = ev.index;
        return false;
      },
    },
    { keep: 'none', detail: false },
  );
  world = res.world;
  if (!divergence && checked < total) {
    divergence = {
      index: checked,
      field: 'missing',
      recorded: r.events.summary(checked) ?? `${r.events.kind(checked)} at ${r.events.node(checked)}`,
      rerun: null,
      message: `event ${checked}: the re-run has no more events (it went ${quiescence(world)}), the recording has ${r.events.summary(checked) ? `"${r.events.summary(checked)}"` : `a ${r.events.kind(checked)} at ${r.events.node(checked)}`}`,
    };
  }
  const partial = r.stop.reason === 'crash';
  if (!divergence && !partial) divergence = checkStop(r, engine, world, checked, chain.hex, hitAt);
  const expectations = checkExpectations(engine, world, r.expectations.map((e) => parseExpectation(e, engine.net)));
  return { ok: divergence === null, checked, divergence, expectations, partial };
}

/** Whether the re-run, after the recorded events, ends as the recording says; a divergence when not. */
function checkStop(r: ReplayFile, engine: Engine, world: World, count: number, digest: string, hitAt: number): Divergence | null {
  const reason = r.stop.reason;
  if (r.final) {
    if (r.final.events !== count) return stopMismatch(count, `the recording has ${count} events but says the run ended after ${r.final.events}`, r.final.events, count);
    if (count > 0 && r.final.digest !== digest) return stopMismatch(count, `the last digest differs (recorded ${r.final.digest}, re-run ${digest})`, r.final.digest, digest);
  }
  // a breakpoint of the file that hits before the end means the run would have stopped there
  if (hitAt >= 0 && (reason !== 'breakpoint' || hitAt !== count - 1)) {
    return stopMismatch(hitAt + 1, `a breakpoint of the recording hits at event ${hitAt}, so the run stops after ${hitAt + 1} events, but the recording goes on to ${count}`, count, hitAt + 1);
  }
  const limits = r.limits ? { events: r.limits.events ?? undefined, untilNs: r.limits.until_ns ?? undefined } : v1Limits(r);
  // the event the run would apply next, if any
  const next = engine.advance(world, 1, {}, { keep: 'last', detail: false });
  const nextEv = next.events[0];
  const nextTime = nextEv?.time;
  switch (reason) {
    case 'breakpoint':
      if (hitAt !== count - 1) return stopMismatch(count, `the recording says a breakpoint stopped it after ${count} events, but no breakpoint hits there in the re-run`, 'breakpoint', 'no hit');
      return null;
    case 'events':
      if (limits.events !== undefined && limits.events !== count) {
        return stopMismatch(count, `the recording stops at its event limit of ${limits.events}, but holds ${count} events`, limits.events, count);
      }
      if (limits.events !== undefined && nextEv === undefined) return stopMismatch(count, `the recording says the event limit stopped it, but the run ends by itself after ${count} events`, 'events', quiescence(world));
      return null;
    case 'until': {
      const u = limits.untilNs;
      if (nextTime === undefined) return stopMismatch(count, `the recording says --until stopped it, but the run ends by itself after ${count} events`, 'until', quiescence(world));
      if (u !== undefined && (nextTime <= u || (count > 0 && r.events.time(count - 1) > u))) {
        return stopMismatch(count, `the recording says the run stopped before the first event after --until ${formatDuration(u)}, but the next event comes at ${formatDuration(nextTime)}`, u, nextTime);
      }
      return null;
    }
    case 'stall':
    case 'idle': {
      if (nextEv) {
        return { index: nextEv.index, field: 'extra', recorded: null, rerun: nextEv.summary, message: `event ${nextEv.index}: the recording ended (${reason}) but the re-run goes on with "${nextEv.summary}"` };
      }
      const q = quiescence(world);
      if (q !== reason) return stopMismatch(count, `the recording says the run ended in a ${reason}, but the re-run ends ${q === 'idle' ? 'idle' : 'in a stall'}`, reason, q);
      return null;
    }
    default:
      return null;
  }
}
