/**
 * Joins the sweep files of shards (or of adjacent ranges) into the file one sweep over the
 * whole range gives, byte for byte. Refuses files of other inputs, limits or expectations,
 * seeds that two files both cover, and holes in the range, naming the files concerned.
 */
import { plural } from '../model/words.js';
import { InputError } from '../model/errors.js';
import { buildReport } from './report.js';
import { inShard, parseShard, shardSeeds, type SeedRange, type Shard } from './seeds.js';
import { SWEEP_FORMAT, type FailureGroup, type SweepReport, type SweepRun } from './types.js';

/** A sweep file read from disk, with the name it is reported by. */
export interface NamedSweep {
  readonly name: string;
  readonly report: SweepReport;
}

const OUTCOMES = new Set(['ok', 'failed', 'stall', 'error']);

function refuse(file: string | undefined, field: string | undefined, message: string, fix: string): InputError {
  return new InputError({ code: 'format', file, field, message, fix });
}

function isObject(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

const isSeed = (v: unknown): v is number => typeof v === 'number' && Number.isSafeInteger(v) && v >= 0;
const isCount = isSeed;
const isNumOrNull = (v: unknown) => v === null || (typeof v === 'number' && Number.isFinite(v));

function checkRun(file: string, i: number, r: unknown): SweepRun {
  const field = `runs[${i}]`;
  const fix = 'use the file exactly as bellstep sweep --json wrote it';
  if (!isObject(r)) throw refuse(file, field, 'is not an object', fix);
  if (!isSeed(r.seed)) throw refuse(file, `${field}.seed`, 'is not a seed (a non-negative integer)', fix);
  if (typeof r.outcome !== 'string' || !OUTCOMES.has(r.outcome)) throw refuse(file, `${field}.outcome`, `is ${JSON.stringify(r.outcome)}, not one of ok, failed, stall, error`, fix);
  for (const k of ['events', 'time_ns', 'delivered'] as const) if (!isCount(r[k])) throw refuse(file, `${field}.${k}`, 'is not a count', fix);
  if (!isNumOrNull(r.fidelity_mean)) throw refuse(file, `${field}.fidelity_mean`, 'is neither a number nor null', fix);
  const failing = r.outcome !== 'ok';
  if (failing ? typeof r.signature !== 'string' : r.signature !== null) {
    throw refuse(file, `${field}.signature`, failing ? 'a failing run needs its signature' : 'a run that passed has no signature', fix);
  }
  return r as unknown as SweepRun;
}

/** Parses and checks one sweep file: its shape, and that its runs are exactly the seeds its header claims. */
export function parseSweepFile(text: string, file: string): SweepReport {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw refuse(file, undefined, `not valid JSON: ${(e as Error).message}`, 'pass the files that bellstep sweep --json wrote');
  }
  const fix = 'use the file exactly as bellstep sweep --json wrote it';
  if (!isObject(raw) || raw.format !== SWEEP_FORMAT) {
    throw refuse(file, 'format', `not a sweep file (format is ${JSON.stringify(isObject(raw) ? (raw.format ?? null) : null)})`, `pass files written by bellstep sweep --json (format "${SWEEP_FORMAT}")`);
  }
  for (const k of ['inputs', 'seeds', 'limits', 'expectations', 'runs', 'stats', 'failures']) {
    if (!(k in raw)) throw refuse(file, k, 'is missing (the file is cut short or was edited)', fix);
  }
  const { inputs, seeds, limits, expectations, runs, failures } = raw;
  if (!isObject(inputs) || typeof inputs.program_set_sha256 !== 'string' || !(inputs.noise_sha256 === null || typeof inputs.noise_sha256 === 'string')) {
    throw refuse(file, 'inputs', 'needs program_set_sha256 and noise_sha256', fix);
  }
  if (!isObject(seeds) || !isSeed(seeds.from) || !isSeed(seeds.to) || seeds.from > seeds.to || !isCount(seeds.count)) {
    throw refuse(file, 'seeds', 'needs from ≤ to and a count', fix);
  }
  if (!(seeds.shard === null || typeof seeds.shard === 'string')) throw refuse(file, 'seeds.shard', 'is neither "I/N" nor null', fix);
  let shard: Shard | undefined;
  try {
    shard = seeds.shard === null ? undefined : parseShard(seeds.shard, 'seeds.shard');
  } catch (e) {
    throw refuse(file, 'seeds.shard', (e as InputError).message, fix);
  }
  if (!isObject(limits) || !isNumOrNull(limits.until_ns) || !isNumOrNull(limits.events)) throw refuse(file, 'limits', 'needs until_ns and events', fix);
  if (limits.breakpoints !== undefined && !(Array.isArray(limits.breakpoints) && limits.breakpoints.every((b) => typeof b === 'string'))) {
    throw refuse(file, 'limits.breakpoints', 'is not a list of breakpoints', fix);
  }
  if (!Array.isArray(expectations) || !expectations.every((e) => typeof e === 'string')) throw refuse(file, 'expectations', 'is not a list of expressions', fix);
  if (!Array.isArray(runs)) throw refuse(file, 'runs', 'is not a list', fix);
  if (!Array.isArray(failures) || !failures.every((f) => isObject(f) && typeof f.signature === 'string' && typeof f.explanation === 'string' && Array.isArray(f.seeds) && f.seeds.length > 0 && f.seeds.every(isSeed))) {
    throw refuse(file, 'failures', 'is not a list of failure groups', fix);
  }
  const checked = runs.map((r, i) => checkRun(file, i, r));
  const range: SeedRange = { from: seeds.from, to: seeds.to };
  const expected = shardSeeds(range, shard);
  const got = new Set(checked.map((r) => r.seed));
  const stray = checked.find((r) => !inShard(range, shard, r.seed));
  if (stray) throw refuse(file, 'runs', `seed ${stray.seed} does not belong to ${seeds.shard === null ? 'the range' : `shard ${seeds.shard} of`} ${range.from}..${range.to}`, fix);
  if (got.size !== checked.length) throw refuse(file, 'runs', 'lists a seed twice', fix);
  const missing = expected.find((s) => !got.has(s));
  if (missing !== undefined || seeds.count !== checked.length) {
    throw refuse(file, 'runs', `holds ${plural(checked.length, 'run')}, but ${seeds.shard === null ? 'the range' : `shard ${seeds.shard} of`} ${range.from}..${range.to} has ${plural(expected.length, 'seed')}${missing !== undefined ? ` (seed ${missing} is missing)` : ''}`, 'the file is cut short or was edited; run that sweep again');
  }
  const signatures = new Set((failures as FailureGroup[]).map((f) => f.signature));
  const unexplained = checked.find((r) => r.signature !== null && !signatures.has(r.signature));
  if (unexplained) throw refuse(file, 'failures', `has no group for the signature of seed ${unexplained.seed}`, fix);
  return raw as unknown as SweepReport;
}

function listSeeds(seeds: readonly number[], max = 5): string {
  const shown = seeds.slice(0, max).join(', ');
  return seeds.length > max ? `${shown} and ${seeds.length - max} more` : shown;
}

function whatDiffers(a: Record<string, unknown>, b: Record<string, unknown>): string {
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])];
  return keys.filter((k) => JSON.stringify(a[k]) !== JSON.stringify(b[k])).map((k) => `${k} ${JSON.stringify(a[k] ?? null)} against ${JSON.stringify(b[k] ?? null)}`).join(', ');
}

function sameRun(first: NamedSweep, other: NamedSweep): void {
  const a = first.report;
  const b = other.report;
  const fix = 'merge only the shards of one sweep: the same files, limits and expectations';
  const d = whatDiffers(b.inputs, a.inputs);
  if (d) throw refuse(other.name, 'inputs', `was run on other inputs than ${first.name} (${d})`, fix);
  const l = whatDiffers(b.limits as unknown as Record<string, unknown>, a.limits as unknown as Record<string, unknown>);
  if (l) throw refuse(other.name, 'limits', `has other limits than ${first.name} (${l})`, fix);
  if (JSON.stringify(a.expectations) !== JSON.stringify(b.expectations)) {
    throw refuse(other.name, 'expectations', `has other expectations than ${first.name} (${JSON.stringify(b.expectations)} against ${JSON.stringify(a.expectations)})`, fix);
  }
}

function missingShards(files: readonly NamedSweep[]): string {
  const shards = files.map((f) => f.report.seeds.shard);
  const counts = new Set(shards.map((s) => (s === null ? null : s.split('/')[1])));
  if (counts.size !== 1 || shards.includes(null)) return '';
  const n = Number(shards[0]!.split('/')[1]);
  const present = new Set(shards.map((s) => Number(s!.split('/')[0])));
  const absent = Array.from({ length: n }, (_, i) => i + 1).filter((i) => !present.has(i));
  return absent.length ? ` (shard ${absent.map((i) => `${i}/${n}`).join(', ')} is not among the files)` : '';
}

/** Merges sweep files into the sweep file of the whole range they cover together. */
export function mergeSweeps(files: readonly NamedSweep[]): SweepReport {
  if (files.length === 0) throw refuse(undefined, 'SWEEP.json', 'merge needs at least one sweep file', 'write e.g. bellstep merge s1.json s2.json s3.json');
  const [first] = files;
  for (const f of files.slice(1)) sameRun(first, f);
  const owner = new Map<number, string>();
  const runs: SweepRun[] = [];
  for (const f of files) {
    for (const r of f.report.runs) {
      const had = owner.get(r.seed);
      if (had !== undefined) {
        const both = f.report.runs.filter((x) => owner.has(x.seed)).map((x) => x.seed);
        throw refuse(f.name, 'seeds', `covers ${both.length === 1 ? 'seed' : 'seeds'} ${listSeeds(both)} that ${had} covers too`, 'each seed may come from one file only: merge the shards of one sweep, each once');
      }
      owner.set(r.seed, f.name);
      runs.push(r);
    }
  }
  const from = Math.min(...files.map((f) => f.report.seeds.from));
  const to = Math.max(...files.map((f) => f.report.seeds.to));
  const holes: number[] = [];
  for (let s = from; s <= to && holes.length <= 5; s++) if (!owner.has(s)) holes.push(s);
  if (holes.length) {
    const total = to - from + 1 - owner.size;
    throw refuse(
      undefined,
      'seeds',
      `the files leave ${total} ${total === 1 ? 'seed' : 'seeds'} of ${from}..${to} uncovered: ${listSeeds(holes)}${total > holes.length ? ' ...' : ''}${missingShards(files)}`,
      'add the missing shard files, or sweep the missing seeds and merge that file too',
    );
  }
  // explanations depend on the signature alone; take each from the file holding its first seed
  const explanation = new Map<string, string>();
  const firstSeed = new Map<string, number>();
  for (const f of files) {
    for (const g of f.report.failures) {
      const s = g.seeds.reduce((a, b) => Math.min(a, b));
      if (!firstSeed.has(g.signature) || s < firstSeed.get(g.signature)!) {
        firstSeed.set(g.signature, s);
        explanation.set(g.signature, g.explanation);
      }
    }
  }
  const r0 = first.report;
  return buildReport(
    { inputs: r0.inputs, seeds: { from, to, shard: null, count: runs.length }, limits: r0.limits, expectations: r0.expectations },
    runs,
    (sig) => explanation.get(sig) ?? '',
  );
}
