/**
 * Replay files: the embedded inputs with their SHA-256, the seed, breakpoints,
 * expectations, the stop, every event with its digest, and a checksum. What bellstep writes
 * is `bellstep/replay@2` (replay-v2.ts: columns in blocks, written as the run goes); files of
 * the first version, `@1` (one JSON object per event, a checksum over canonical JSON), still
 * load and verify. Both load into one shape, `ReplayFile`, with the events as columns.
 */
import { plural } from '../model/words.js';
import { createHash } from 'node:crypto';
import { basename } from 'node:path';
import type { Engine, EngineEvent, World } from '../engine/index.js';
import { InputError } from '../model/errors.js';
import type { ProgramSet, NoiseModel } from '../model/types.js';
import { eventDigestHalves, eventDigestInto2, GENESIS_DIGEST } from './digest.js';
import { ListEvents, type ReplayEvents } from './replay-columns.js';
import { checksumV2, decodeEvents, REPLAY_FORMAT_V2, ReplayWriter, type ReplayFinal, type ReplayHead, type ReplayLimits } from './replay-v2.js';
import type { Stop } from './summary.js';

/** The first version's format tag; its files still load. */
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
  /** The one-line text; null where a `@2` file did not keep it (it keeps the last events' only). */
  summary: string | null;
  digest: string;
}

/** A loaded replay of either version. */
export interface ReplayFile {
  format: string;
  tool: { name: string; version: string };
  inputs: { program_set: ReplayInput; noise: ReplayInput | null };
  seed: number;
  breakpoints: string[];
  expectations: string[];
  stop: Stop;
  /** The limits the run was made under (`@2`; null in an `@1` file, which did not record them). */
  limits: ReplayLimits | null;
  /** The event count and last digest the run ended with (`@2`; null in an `@1` file). */
  final: ReplayFinal | null;
  events: ReplayEvents;
  checksum: string;
}

/** An `@1` file as it stands on disk (one object per event, no limits or final record). */
export type ReplayFileV1 = Omit<ReplayFile, 'limits' | 'final' | 'events'> & { events: ReplayEvent[] };

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

/** The checksum of an `@1` replay object: SHA-256 of the canonical JSON of everything but `checksum`. */
export function replayChecksum(r: Omit<ReplayFileV1, 'checksum'> & { checksum?: string }): string {
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

/** Serialises an `@1` replay with one event per line (kept to write old-version files in tests). */
export function serializeReplay(r: ReplayFileV1): string {
  const head = Object.entries(r)
    .filter(([k]) => k !== 'events' && k !== 'checksum')
    .map(([k, v]) => `  ${JSON.stringify(k)}: ${JSON.stringify(v)}`);
  const events = r.events.map((e) => `    ${JSON.stringify(e)}`).join(',\n');
  return `{\n${head.join(',\n')},\n  "events": [\n${events}\n  ],\n  "checksum": ${JSON.stringify(r.checksum)}\n}\n`;
}

/** Builds an `@1` replay object from inputs and recorded events (the first version's layout). */
export function buildReplay(
  programSet: ProgramSet,
  noise: NoiseModel,
  meta: { seed: number; breakpoints: readonly string[]; expectations: readonly string[] },
  stop: Stop,
  events: ReplayEvent[],
): ReplayFileV1 {
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

/**
 * The chain of per-event digests: each event's record carries the digest of the world after
 * it. Version 1 is the digest of `@1` files; version 2 (the default) that of `@2` files.
 */
export class DigestChain {
  /** The digest after the last event, as two 32-bit halves (the genesis digest is all zeros). */
  hi = 0;
  lo = 0;

  constructor(readonly version: 1 | 2 = 2) {}

  /** The record of the next event, given the world after it. */
  next(ev: EngineEvent, w: World): ReplayEvent {
    this.advance(ev, w);
    return replayEvent(ev, this.hex);
  }

  /** Moves the chain past an event without building its record. */
  advance(ev: EngineEvent, w: World): void {
    if (this.version === 2) eventDigestInto2(this, ev, w);
    else [this.hi, this.lo] = eventDigestHalves(this.hi, this.lo, ev, w);
  }

  /** The digest after the last event, as 16 hex digits. */
  get hex(): string {
    return (this.hi >>> 0).toString(16).padStart(8, '0') + (this.lo >>> 0).toString(16).padStart(8, '0');
  }
}

/** The digest version of a replay's format. */
export function digestVersion(format: string): 1 | 2 {
  return format === REPLAY_FORMAT ? 1 : 2;
}

/** What a recording says about itself: the seed, breakpoints, expectations and limits it ran with. */
export interface RecordingMeta {
  readonly seed: number;
  readonly breakpoints: readonly string[];
  readonly expectations: readonly string[];
  readonly limits?: ReplayLimits;
}

/** The head of a `@2` file for a network's inputs and a recording's meta. */
export function replayHead(programSet: ProgramSet, noise: NoiseModel, meta: RecordingMeta): ReplayHead {
  return {
    tool: { ...TOOL },
    inputs: { program_set: input(programSet.file, programSet.text), noise: noise.file ? input(noise.file, noise.text) : null },
    seed: meta.seed,
    breakpoints: [...meta.breakpoints],
    expectations: [...meta.expectations],
    limits: meta.limits ?? { until_ns: null, events: null },
  };
}

/**
 * Records events and digests during a run as a `@2` file. With a sink, the file streams out
 * as the run goes (memory stays flat); without one, `finish` returns the whole text.
 */
export class Recorder {
  private readonly chain = new DigestChain();
  private readonly writer: ReplayWriter;
  private readonly parts: string[] = [];

  constructor(
    private readonly engine: Engine,
    meta: RecordingMeta,
    sink?: (chunk: string) => void,
  ) {
    const { programSet, noise } = engine.net;
    this.writer = new ReplayWriter(replayHead(programSet, noise, meta), engine.net.nodeIds, sink ?? ((c) => void this.parts.push(c)));
  }

  /** Adds an event with the world after it. */
  add(ev: EngineEvent, w: World): void {
    this.chain.advance(ev, w);
    // the text is built only for the events that end up among the file's last ones
    this.writer.add(ev.time, ev.node, ev.type, this.chain.hi, this.chain.lo, ev);
  }

  /** Events recorded so far. */
  get count(): number {
    return this.writer.events;
  }

  /** The digest after the last event recorded. */
  get lastDigest(): string {
    return this.writer.events === 0 ? GENESIS_DIGEST : this.chain.hex;
  }

  /** Ends the file with `stop`; returns its text when there is no sink (else the empty string). */
  finish(stop: Stop): string {
    this.writer.finish(stop, { events: this.writer.events, digest: this.lastDigest });
    return this.parts.join('');
  }

  /** Ends the file as the automatic replay of a run that crashed: `stop.reason` is `crash`. */
  partial(why: string): string {
    return this.finish({ reason: 'crash', detail: `automatic replay of the first ${plural(this.writer.events, 'event')}: ${why}` });
  }
}

function bad(message: string, fix: string, file?: string): InputError {
  return new InputError({ code: 'replay', file, message, fix });
}

const STOP_REASONS = new Set(['until', 'events', 'idle', 'stall', 'breakpoint', 'crash']);
const HEX16 = /^[0-9a-f]{16}$/;

/** Checks a parsed value against the shape a replay must have; returns what is wrong, or undefined. */
type Check = (v: unknown, at: string) => string | undefined;

const isObj = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);
const str: Check = (v, at) => (typeof v === 'string' ? undefined : `${at} must be text`);
const int: Check = (v, at) => (typeof v === 'number' && Number.isSafeInteger(v) && v >= 0 ? undefined : `${at} must be a whole number ≥ 0`);
const seedCheck: Check = (v, at) => (typeof v === 'number' && Number.isSafeInteger(v) ? undefined : `${at} must be a whole number`);
const hex16: Check = (v, at) => (typeof v === 'string' && HEX16.test(v) ? undefined : `${at} must be 16 hex digits`);
const nullable = (c: Check): Check => (v, at) => (v === null ? undefined : c(v, at));
const list = (c: Check): Check => (v, at) => {
  if (!Array.isArray(v)) return `${at} must be a list`;
  for (let i = 0; i < v.length; i++) {
    const bad = c(v[i], `${at}[${i}]`);
    if (bad) return bad;
  }
  return undefined;
};
const record = (fields: Record<string, Check>): Check => (v, at) => {
  if (!isObj(v)) return `${at} must be an object`;
  for (const [k, c] of Object.entries(fields)) {
    if (!Object.hasOwn(v, k)) return `${at} has no "${k}"`;
    const bad = c(v[k], `${at}.${k}`);
    if (bad) return bad;
  }
  return undefined;
};
const inputShape = record({ file: str, text: str, sha256: str });
const eventShape = (summary: Check): Check => record({ index: int, time_ns: int, node: str, kind: str, summary, digest: hex16 });
const stopShape: Check = (v, at) => record({ reason: str, detail: str })(v, at) ?? (STOP_REASONS.has((v as Stop).reason) ? undefined : `${at}.reason must be one of ${[...STOP_REASONS].join(', ')}`);

const COMMON: Record<string, Check> = {
  tool: record({ name: str, version: str }),
  inputs: record({ program_set: inputShape, noise: nullable(inputShape) }),
  seed: seedCheck,
  breakpoints: list(str),
  expectations: list(str),
  stop: stopShape,
  checksum: str,
};

const V2_SHAPE = record({
  ...COMMON,
  limits: record({ until_ns: nullable(int), events: nullable(int) }),
  tables: record({ nodes: list(str), kinds: list(str) }),
  blocks: list(record({ first: int, count: int, start_ns: int, time: str, event: str, digest: str })),
  recent: list(eventShape(nullable(str))),
  final: record({ events: int, digest: hex16 }),
});

/** Parses and validates a replay file of either version; refuses foreign, truncated, newer, misshapen or tampered files (exit 2). */

const TOP_KEYS: readonly string[] = ['format', 'tool', 'inputs', 'seed', 'breakpoints', 'expectations', 'stop', 'events', 'checksum'];
const DIGEST = /^[0-9a-f]{16}$/;
const INPUT_KEYS: readonly string[] = ['file', 'text', 'sha256'];


/**
 * Checks that a parsed `bellstep/replay@1` object has the shape of one, field by field,
 * before anything (the checksum included) walks it: a null event, a string where a list
 * belongs or arrays nested thousands deep are refused here with the field that is wrong.
 * Extra keys are left alone: the checksum covers them.
 */
export function validateReplayShape(raw: unknown, file?: string): ReplayFileV1 {
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
  if (!STOP_REASONS.has(stop.reason as string)) wrong('stop.reason', `one of ${[...STOP_REASONS].join(', ')}`, stop.reason);
  if (!Array.isArray(r.events)) wrong('events', 'a list of events', r.events);
  const events = r.events as unknown[];
  for (let i = 0; i < events.length; i++) {
    const field = `events[${i}]`;
    const e = object(events[i], field);
    count(e.index, `${field}.index`);
    count(e.time_ns, `${field}.time_ns`);
    for (const k of ['node', 'kind', 'summary', 'digest']) text(e, k, field);
    if (!DIGEST.test(e.digest as string)) wrong(`${field}.digest`, '16 hexadecimal digits', e.digest);
    only(e, EVENT_KEYS, field);
  }
  text(r, 'checksum', '');
  return r as unknown as ReplayFileV1;
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
  if (!isObj(raw)) throw bad('not a replay file (expected a JSON object)', 'pass a file written by `bellstep run --record`', file);
  const format = raw.format;
  if (typeof format !== 'string' || !format.startsWith('bellstep/replay@')) {
    throw bad(`not a bellstep replay file (format is ${JSON.stringify(format ?? null)})`, `expected "format": "${REPLAY_FORMAT_V2}"`, file);
  }
  if (format !== REPLAY_FORMAT && format !== REPLAY_FORMAT_V2) {
    const v = Number(format.split('@')[1]);
    throw bad(
      Number.isFinite(v) && v > 2 ? `the replay was written by a newer bellstep (format ${format}); this one reads ${REPLAY_FORMAT} and ${REPLAY_FORMAT_V2}` : `unsupported replay format ${format}`,
      'open it with the bellstep version that wrote it (see its "tool" field)',
      file,
    );
  }
  const v2 = format === REPLAY_FORMAT_V2;
  for (const key of Object.keys(v2 ? { ...COMMON, limits: 0, tables: 0, blocks: 0, recent: 0, final: 0 } : { ...COMMON, events: 0 })) {
    if (!Object.hasOwn(raw, key)) throw bad(`the replay file has no "${key}" (truncated or edited by hand)`, 'use the complete file as written by bellstep', file);
  }
  // the checksum first: a file changed by accident is named as such, whatever else is wrong with it
  const checksum = typeof raw.checksum === 'string' ? raw.checksum : '';
  const expected = v2 ? checksumV2(text) : Array.isArray(raw.events) ? safeChecksum(raw) : undefined;
  // an @1 object whose checksum cannot even be computed (lists nested too deep) is wrong in a
  // field that validateReplayShape names
  if (!v2 && expected === undefined) validateReplayShape(raw, file);
  if (expected === undefined || expected !== checksum) {
    throw bad('checksum mismatch: the replay file was changed after it was written', 'record the run again; do not edit replay files by hand', file);
  }
  if (v2) {
    const wrong = V2_SHAPE(raw, 'the file');
    if (wrong) throw bad(`the replay file has the wrong shape: ${wrong}`, 'use the file as written by bellstep', file);
  } else validateReplayShape(raw, file);
  const r = raw as unknown as ReplayFileV1 & { limits: ReplayLimits; final: ReplayFinal; tables: { nodes: string[]; kinds: string[] }; blocks: []; recent: ReplayEvent[] };
  for (const [name, inp] of [['program set', r.inputs.program_set], ['noise model', r.inputs.noise]] as const) {
    if (inp && sha256(inp.text) !== inp.sha256) {
      throw bad(`the embedded ${name} does not match its SHA-256`, 'record the run again; do not edit replay files by hand', file);
    }
  }
  let events: ReplayEvents;
  if (v2) {
    try {
      events = decodeEvents(r.tables, r.blocks, r.recent);
    } catch (e) {
      throw bad(`the replay file's events cannot be read: ${(e as Error).message}`, 'use the file as written by bellstep', file);
    }
  } else events = new ListEvents(r.events);
  const { tool, inputs, seed, breakpoints, expectations, stop } = r;
  return { format, tool, inputs, seed, breakpoints, expectations, stop, limits: v2 ? r.limits : null, final: v2 ? r.final : null, events, checksum };
}

/** The `@1` checksum of a raw object, or undefined when it cannot be computed (a value nested too deep). */
function safeChecksum(raw: Record<string, unknown>): string | undefined {
  try {
    return replayChecksum(raw as unknown as ReplayFileV1);
  } catch {
    return undefined;
  }
}
