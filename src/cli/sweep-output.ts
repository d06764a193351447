/**
 * What `sweep` and `merge` write for people and for CI besides the JSON: the closing text
 * report with a table of signatures (each with the command that opens one in the debugger)
 * and the JUnit suite (one failing case per signature, one passing case for the rest).
 */
import { plural } from '../model/words.js';
import { join } from 'node:path';
import { type JunitCase, type JunitSuite } from '../report/junit.js';
import { figure, textTable } from '../report/table.js';
import type { FailureGroup, Outcome, SweepReport } from '../sweep/types.js';

/** Where the replays of failing seeds are, and how to re-run a seed when there are none. */
export interface OpenHints {
  /** The --save-failures folder of this job; undefined when it saved none or is unknown (merge). */
  readonly saveDir?: string;
  /** True when this job ran without --save-failures. */
  readonly notSaved?: boolean;
  /** The run command's inputs and flags, to re-run a seed when no replay was saved. */
  readonly rerun?: readonly string[];
}

/** The file name a failing seed's replay gets in the --save-failures folder. */
export function replayName(seed: number): string {
  return `seed-${seed}.replay.json`;
}

/** Quotes an argument for a POSIX shell when it needs it. */
export function shellArg(s: string): string {
  return /^[\w@%+=:,./~-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`;
}

function outcomeOf(r: SweepReport, g: FailureGroup): Outcome {
  const seed = g.seeds[0];
  return r.runs.find((x) => x.seed === seed)?.outcome ?? 'failed';
}

/** The command that opens the group's first seed in the debugger, at its last event when a replay exists. */
export function openCommand(r: SweepReport, g: FailureGroup, hints: OpenHints): string {
  const seed = g.seeds[0];
  const run = r.runs.find((x) => x.seed === seed);
  if (g.signature.startsWith('crash |')) return `bellstep run ${(hints.rerun ?? ['NET.yaml']).map(shellArg).join(' ')} --seed ${seed}   (the worker died: no replay)`;
  if (hints.notSaved && hints.rerun) return `bellstep debug ${hints.rerun.map(shellArg).join(' ')} --seed ${seed}   (add --save-failures DIR to keep replays)`;
  const file = hints.saveDir === undefined ? replayName(seed) : join(hints.saveDir, replayName(seed));
  const at = run && run.events > 0 ? ` --at ${run.events - 1}` : '';
  return `bellstep debug --replay ${shellArg(file)}${at}`;
}

function percent(v: number | null): string {
  return v === null ? '–' : `${figure(v * 100, 2)} %`;
}

/** The statistics as a few lines of text. */
export function statsLines(r: SweepReport): string[] {
  const s = r.stats;
  const range = `${r.seeds.from}..${r.seeds.to}`;
  const scope = r.seeds.shard ? `seeds ${range}, shard ${r.seeds.shard} (${plural(r.seeds.count, 'seed')})` : `seeds ${range} (${plural(r.seeds.count, 'seed')})`;
  const spreadLine = (label: string, x: { mean: number | null; p5: number | null; p50: number | null; p95: number | null }, digits: number) =>
    `${label}: mean ${figure(x.mean, digits)}, p5 ${figure(x.p5, digits)}, p50 ${figure(x.p50, digits)}, p95 ${figure(x.p95, digits)}`;
  return [
    `sweep of ${scope}: ${s.runs - s.failed} passed, ${s.failed} failed`,
    `failure rate ${percent(s.failure_rate.value)} (95 % Wilson interval ${percent(s.failure_rate.low95)} to ${percent(s.failure_rate.high95)})`,
    spreadLine('delivered pairs per run', s.delivered_per_run, 2),
    spreadLine('delivered pairs per simulated second', s.delivered_per_second, 2),
    `fidelity (each run's mean over its delivered pairs): mean ${figure(s.fidelity.mean)}, min ${figure(s.fidelity.min)}, p5 ${figure(s.fidelity.p5)}, p50 ${figure(s.fidelity.p50)}, p95 ${figure(s.fidelity.p95)}`,
  ];
}

/** Characters of a signature the closing table shows. */
const SIGNATURE_WIDTH = 96;

function seedList(seeds: readonly number[], max = 8): string {
  return seeds.length > max ? `${seeds.slice(0, max).join(', ')} and ${seeds.length - max} more` : seeds.join(', ');
}

/** The closing report: statistics, then the table of signatures and how to open each. */
export function sweepText(r: SweepReport, hints: OpenHints): string {
  const lines = statsLines(r);
  if (r.failures.length === 0) {
    lines.push('', r.stats.runs ? 'every seed passed' : 'this shard holds no seeds');
    return `${lines.join('\n')}\n`;
  }
  lines.push('', 'failures, most frequent first:', '');
  // the table shows the start of each signature; the JSON and the JUnit report hold it whole
  const cut = (sig: string) => (sig.length > SIGNATURE_WIDTH ? `${sig.slice(0, SIGNATURE_WIDTH - 1)}…` : sig);
  const rows = r.failures.map((g, i) => [String(i + 1), String(g.count), String(g.seeds[0]), outcomeOf(r, g), cut(g.signature)]);
  lines.push(...textTable(['#', 'seeds', 'first', 'outcome', 'signature'], rows, ['right', 'right', 'right', 'left', 'left']));
  for (const [i, g] of r.failures.entries()) {
    lines.push('', `${i + 1}. ${g.explanation}`, `   seeds: ${seedList(g.seeds)}`, `   open the first: ${openCommand(r, g, hints)}`);
  }
  return `${lines.join('\n')}\n`;
}

/** The JUnit suite of a sweep or merge; `ms` gives each seed's wall time when known (a merge does not know it). */
export function sweepSuite(name: string, r: SweepReport, hints: OpenHints, ms: ReadonlyMap<number, number>, totalMs: number, started: Date): JunitSuite {
  const secs = (seeds: readonly number[]) => seeds.reduce((a, s) => a + (ms.get(s) ?? 0), 0) / 1000;
  const cases: JunitCase[] = r.failures.map((g) => {
    const outcome = outcomeOf(r, g);
    const crashed = g.signature.startsWith('crash |');
    const names = g.seeds.map(replayName).join(', ');
    const replays = crashed
      ? 'replays: none (the worker running these seeds died)'
      : hints.notSaved
        ? `replays: none written by this job; with --save-failures DIR it writes ${names}`
        : `replays (in ${hints.saveDir === undefined ? 'the --save-failures folder of the job that ran each seed' : `the --save-failures folder ${hints.saveDir}`}): ${names}`;
    const text = [`seeds (${g.count}): ${g.seeds.join(', ')}`, replays, `open the first: ${openCommand(r, g, hints)}`, `signature: ${g.signature}`].join('\n');
    const problem = { type: outcome, message: g.explanation, text };
    const base = { name: g.signature, classname: 'bellstep.sweep', seconds: secs(g.seeds) };
    return outcome === 'error' ? { ...base, error: problem } : { ...base, failure: problem };
  });
  const passed = r.runs.filter((x) => x.outcome === 'ok').map((x) => x.seed);
  if (passed.length) cases.push({ name: `${passed.length} of ${plural(r.stats.runs, 'seed')} passed`, classname: 'bellstep.sweep', seconds: secs(passed) });
  return {
    name,
    package: 'bellstep.sweep',
    cases,
    seconds: totalMs / 1000,
    timestamp: started,
    properties: [
      ['seeds', `${r.seeds.from}..${r.seeds.to}`],
      ['shard', r.seeds.shard ?? 'whole range'],
      ['program_set_sha256', r.inputs.program_set_sha256],
      ['noise_sha256', r.inputs.noise_sha256 ?? 'none (ideal)'],
      ['expectations', r.expectations.join('; ')],
    ],
    systemOut: `${statsLines(r).join('\n')}\n`,
  };
}
