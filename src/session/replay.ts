/**
 * Replay files (FORMAT.md §7): the embedded inputs with their SHA-256, the seed,
 * breakpoints, expectations, the stop, every event with its digest, and a checksum over
 * everything else. Export, import with validation, and verification by re-running.
 */
import { plural } from '../model/words.js';
import { createHash } from 'node:crypto';
import { basename } from 'node:path';
import type { Engine, EngineEvent, World } from '../engine/index.js';
import { InputError } from '../model/errors.js';
import type { ProgramSet, NoiseModel } from '../model/types.js';
import { eventDigest, GENESIS_DIGEST } from './digest.js';
import type { Stop } from './summary.js';

export const REPLAY_FORMAT = 'bellstep/replay@1';
export const TOOL = { name: 'bellstep', version: '0.1.0' } as const;

export interface ReplayInput {
  file: string;
  text: string;
  sha256: string;
}

export interface ReplayEvent {
  index: number;
  time_ns: number;
  node: string;
  kind: string;
  summary: string;
  digest: string;
}

export interface ReplayFile {
  format: string;
  tool: { name: string; version: string };
  inputs: { program_set: ReplayInput; noise: ReplayInput | null };
  seed: number;
  breakpoints: string[];
  expectations: string[];
  stop: Stop;
  events: ReplayEvent[];
  checksum: string;
}

export function sha256(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** JSON with object keys sorted at every level, so the checksum ignores layout and key order. */
export function canonicalJson(v: unknown): string {
  return JSON.stringify(sortedKeys(v));
}

const EVENT_KEYS = ['index', 'time_ns', 'node', 'kind', 'summary', 'digest'];

function isEventShape(e: object): e is ReplayEvent {
  const keys = Object.keys(e);
  return keys.length === EVENT_KEYS.length && EVENT_KEYS.every((k) => Object.hasOwn(e, k));
}

// copies with keys inserted in sorted order, then one native stringify: much faster than
// building the string by hand for files with a million events
function sortedKeys(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(sortedKeys);
  if (v !== null && typeof v === 'object') {
    // events are almost all of a replay: a literal in sorted key order is much faster than sorting
    if (isEventShape(v)) return { digest: v.digest, index: v.index, kind: v.kind, node: v.node, summary: v.summary, time_ns: v.time_ns };
    const o = v as Record<string, unknown>;
    const out: Record<string, unknown> = {};
    for (const k of Object.keys(o).sort()) {
      if (o[k] === undefined) continue;
      // a "__proto__" key in a file stays an ordinary key instead of setting the prototype
      if (k === '__proto__') Object.defineProperty(out, k, { value: sortedKeys(o[k]), enumerable: true, writable: true, configurable: true });
      else out[k] = sortedKeys(o[k]);
    }
    return out;
  }
  return v;
}

/** The checksum of a replay object: SHA-256 of the canonical JSON of everything but `checksum`. */
export function replayChecksum(r: Omit<ReplayFile, 'checksum'> & { checksum?: string }): string {
  const { checksum: _omit, ...rest } = r;
  return `sha256:${sha256(canonicalJson(rest))}`;
}

/** The replay event line of an engine event. */
export function replayEvent(ev: EngineEvent, digest: string): ReplayEvent {
  return { index: ev.index, time_ns: ev.time, node: ev.node, kind: ev.type, summary: ev.summary, digest };
}

function input(file: string, text: string): ReplayInput {
  return { file: basename(file), text, sha256: sha256(text) };
}

/** Serialises a replay with one event per line, so files diff well. */
export function serializeReplay(r: ReplayFile): string {
  const head = Object.entries(r)
    .filter(([k]) => k !== 'events' && k !== 'checksum')
    .map(([k, v]) => `  ${JSON.stringify(k)}: ${JSON.stringify(v)}`);
  const events = r.events.map((e) => `    ${JSON.stringify(e)}`).join(',\n');
  return `{\n${head.join(',\n')},\n  "events": [\n${events}\n  ],\n  "checksum": ${JSON.stringify(r.checksum)}\n}\n`;
}

/** Builds a replay file from inputs and recorded events. */
export function buildReplay(
  programSet: ProgramSet,
  noise: NoiseModel,
  meta: { seed: number; breakpoints: readonly string[]; expectations: readonly string[] },
  stop: Stop,
  events: ReplayEvent[],
): ReplayFile {
  const body = {
    format: REPLAY_FORMAT,
    tool: { ...TOOL },
    inputs: {
      program_set: input(programSet.file, programSet.text),
      noise: noise.file ? input(noise.file, noise.text) : null,
    },
    seed: meta.seed,
    breakpoints: [...meta.breakpoints],
    expectations: [...meta.expectations],
    stop,
    events,
  };
  return { ...body, checksum: replayChecksum(body) };
}

/** The chain of per-event digests: each event's record carries the digest of the world after it. */
export class DigestChain {
  private digest = GENESIS_DIGEST;

  /** The record of the next event, given the world after it. */
  next(ev: EngineEvent, w: World): ReplayEvent {
    this.digest = eventDigest(this.digest, ev, w);
    return replayEvent(ev, this.digest);
  }
}

/** Records events and digests during a run and produces the replay file. */
export class Recorder {
  readonly events: ReplayEvent[] = [];
  private readonly chain = new DigestChain();

  constructor(
    private readonly engine: Engine,
    private readonly meta: { seed: number; breakpoints: readonly string[]; expectations: readonly string[] },
  ) {}

  /** Adds an event with the world after it. */
  add(ev: EngineEvent, w: World): void {
    this.events.push(this.chain.next(ev, w));
  }

  /** The replay text for a run that ended with `stop`. */
  finish(stop: Stop): string {
    const { programSet, noise } = this.engine.net;
    return serializeReplay(buildReplay(programSet, noise, this.meta, stop, this.events));
  }

  /** The replay of the run so far, for the automatic replay written on an internal error. */
  partial(why: string): string {
    const n = this.events.length;
    return this.finish({ reason: 'events', detail: `automatic replay of the first ${plural(n, 'event')}: ${why}` });
  }
}

function bad(message: string, fix: string, file?: string): InputError {
  return new InputError({ code: 'replay', file, message, fix });
}

const TOP_KEYS: readonly string[] = ['format', 'tool', 'inputs', 'seed', 'breakpoints', 'expectations', 'stop', 'events', 'checksum'];
const INPUT_KEYS: readonly string[] = ['file', 'text', 'sha256'];

/** Stop reasons a `bellstep/replay@1` file may hold. */
const STOP_REASONS: readonly string[] = ['until', 'events', 'idle', 'stall', 'breakpoint', 'crash'];

/**
 * Checks that a parsed `bellstep/replay@1` object has the shape of one, field by field,
 * before anything (the checksum included) walks it: a null event, a string where a list
 * belongs or arrays nested thousands deep are refused here with the field that is wrong.
 * Extra keys are left alone: the checksum covers them.
 */
export function validateReplayShape(raw: unknown, file?: string): ReplayFile {
  const fix = 'use the replay file as bellstep wrote it; record the run again if it was edited';
  const kind = (v: unknown): string =>
    v === null ? 'null' : Array.isArray(v) ? 'a list' : typeof v === 'object' ? 'an object' : typeof v === 'string' ? `text ${JSON.stringify(v.length > 40 ? `${v.slice(0, 40)}…` : v)}` : `${typeof v} ${String(v)}`;
  const wrong = (field: string, want: string, got: unknown): never => {
    throw new InputError({ code: 'replay', file, field, message: `expected ${want}, got ${kind(got)}`, fix });
  };
  const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);
  const object = (v: unknown, field: string): Record<string, unknown> => (isObject(v) ? v : wrong(field, 'an object', v));
  const at = (field: string, key: string): string => (field ? `${field}.${key}` : key);
  const text = (o: Record<string, unknown>, key: string, field: string): void => {
    if (!Object.hasOwn(o, key)) throw new InputError({ code: 'replay', file, field: at(field, key), message: `missing "${key}" (the file is truncated or was edited)`, fix });
    if (typeof o[key] !== 'string') wrong(at(field, key), 'text', o[key]);
  };
  // a key bellstep never writes is refused too, so nothing unchecked (say, lists nested
  // thousands deep) reaches the checksum, which walks the whole object
  const only = (o: Record<string, unknown>, keys: readonly string[], field: string): void => {
    for (const k of Object.keys(o)) {
      if (!keys.includes(k)) throw new InputError({ code: 'replay', file, field: at(field, k), message: `unknown field "${k}" in a ${REPLAY_FORMAT} file`, fix });
    }
  };
  const count = (v: unknown, field: string): void => {
    if (typeof v !== 'number' || !Number.isSafeInteger(v) || v < 0) wrong(field, 'a whole number of at least 0', v);
  };
  const input = (v: unknown, field: string): void => {
    const o = object(v, field);
    for (const k of INPUT_KEYS) text(o, k, field);
    only(o, INPUT_KEYS, field);
  };
  const strings = (v: unknown, field: string): void => {
    if (!Array.isArray(v)) return wrong(field, 'a list of texts', v);
    v.forEach((x, i) => typeof x === 'string' || wrong(`${field}[${i}]`, 'text', x));
  };

  const r = object(raw, '(top level)');
  for (const key of TOP_KEYS) {
    if (!Object.hasOwn(r, key)) throw new InputError({ code: 'replay', file, field: key, message: `the replay file has no "${key}" (truncated or edited by hand)`, fix });
  }
  only(r, TOP_KEYS, '');
  text(r, 'format', '');
  const tool = object(r.tool, 'tool');
  text(tool, 'name', 'tool');
  text(tool, 'version', 'tool');
  only(tool, ['name', 'version'], 'tool');
  const inputs = object(r.inputs, 'inputs');
  if (!Object.hasOwn(inputs, 'noise')) throw new InputError({ code: 'replay', file, field: 'inputs.noise', message: 'missing "noise" (null when the run had no noise model)', fix });
  only(inputs, ['program_set', 'noise'], 'inputs');
  input(inputs.program_set, 'inputs.program_set');
  if (inputs.noise !== null) input(inputs.noise, 'inputs.noise');
  count(r.seed, 'seed');
  strings(r.breakpoints, 'breakpoints');
  strings(r.expectations, 'expectations');
  const stop = object(r.stop, 'stop');
  text(stop, 'reason', 'stop');
  text(stop, 'detail', 'stop');
  only(stop, ['reason', 'detail'], 'stop');
  if (!STOP_REASONS.includes(stop.reason as string)) wrong('stop.reason', `one of ${STOP_REASONS.join(', ')}`, stop.reason);
  if (!Array.isArray(r.events)) wrong('events', 'a list of events', r.events);
  const events = r.events as unknown[];
  for (let i = 0; i < events.length; i++) {
    const field = `events[${i}]`;
    const e = object(events[i], field);
    count(e.index, `${field}.index`);
    count(e.time_ns, `${field}.time_ns`);
    for (const k of ['node', 'kind', 'summary', 'digest']) text(e, k, field);
    only(e, EVENT_KEYS, field);
  }
  text(r, 'checksum', '');
  return r as unknown as ReplayFile;
}

/** Parses and validates a replay file; refuses foreign, truncated, newer or tampered files (exit 2). */
export function parseReplay(text: string, file?: string): ReplayFile {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    const truncated = text.trim().length > 0 && !text.trim().endsWith('}');
    throw bad(
      truncated ? 'the replay file is truncated (it does not end with a closing brace)' : `not valid JSON: ${(e as Error).message}`,
      'use the complete file written by `bellstep run --record` or by the debugger',
      file,
    );
  }
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) throw bad('not a replay file (expected a JSON object)', 'pass a file written by `bellstep run --record`', file);
  const r = raw as Partial<ReplayFile>;
  if (typeof r.format !== 'string' || !r.format.startsWith('bellstep/replay@')) {
    throw bad(`not a bellstep replay file (format is ${JSON.stringify(r.format ?? null)})`, `expected "format": "${REPLAY_FORMAT}"`, file);
  }
  if (r.format !== REPLAY_FORMAT) {
    const v = Number(r.format.split('@')[1]);
    throw bad(
      Number.isFinite(v) && v > 1 ? `the replay was written by a newer bellstep (format ${r.format}); this one reads ${REPLAY_FORMAT}` : `unsupported replay format ${r.format}`,
      'open it with the bellstep version that wrote it (see its "tool" field)',
      file,
    );
  }
  const full = validateReplayShape(raw, file);
  if (replayChecksum(full) !== full.checksum) {
    throw bad('checksum mismatch: the replay file was changed after it was written', 'record the run again; do not edit replay files by hand', file);
  }
  for (const [name, inp] of [['program set', full.inputs.program_set], ['noise model', full.inputs.noise]] as const) {
    if (inp && sha256(inp.text) !== inp.sha256) {
      throw bad(`the embedded ${name} does not match its SHA-256`, 'record the run again; do not edit replay files by hand', file);
    }
  }
  return full;
}
