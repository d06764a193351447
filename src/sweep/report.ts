/**
 * Builds the sweep file of docs/cli.md from its runs. A sweep and a merge both end here,
 * with the runs in seed order, so the same runs give the same bytes whichever way they came.
 */
import { spread, wilsonInterval, mean, nearestRank } from '../session/stats.js';
import { SWEEP_FORMAT, type FailureGroup, type SweepLimits, type SweepReport, type SweepRun } from './types.js';

/** The part of a sweep file that says what was run. */
export type SweepHeader = Pick<SweepReport, 'inputs' | 'seeds' | 'limits' | 'expectations'>;

/**
 * The statistics of §8. Rates and counts range over runs that ended without an error (an
 * erred run has no summary). Fidelity figures range over runs that delivered at least one
 * pair, each counted once by its mean delivered fidelity, so that they can be recomputed
 * from `runs` when shards are merged; they are null when no run delivered anything.
 */
export function sweepStats(runs: readonly SweepRun[]): SweepReport['stats'] {
  const failed = runs.filter((r) => r.outcome !== 'ok').length;
  const finished = runs.filter((r) => r.outcome !== 'error');
  const rate = wilsonInterval(failed, runs.length);
  const fidelities = runs.flatMap((r) => (r.fidelity_mean === null ? [] : [r.fidelity_mean]));
  const sortedFid = [...fidelities].sort((a, b) => a - b);
  return {
    runs: runs.length,
    failed,
    failure_rate: { value: rate?.value ?? null, low95: rate?.low95 ?? null, high95: rate?.high95 ?? null },
    delivered_per_run: spread(finished.map((r) => r.delivered)),
    delivered_per_second: spread(finished.filter((r) => r.time_ns > 0).map((r) => r.delivered / (r.time_ns / 1e9))),
    fidelity: {
      mean: mean(fidelities) ?? null,
      min: sortedFid[0] ?? null,
      p5: nearestRank(sortedFid, 5) ?? null,
      p50: nearestRank(sortedFid, 50) ?? null,
      p95: nearestRank(sortedFid, 95) ?? null,
    },
  };
}

/** Groups failing runs by signature: most frequent first, ties by first seed. */
export function groupFailures(runs: readonly SweepRun[], explain: (signature: string) => string): FailureGroup[] {
  const groups = new Map<string, number[]>();
  for (const r of runs) {
    if (r.signature === null) continue;
    const seeds = groups.get(r.signature);
    if (seeds) seeds.push(r.seed);
    else groups.set(r.signature, [r.seed]);
  }
  return [...groups]
    .map(([signature, seeds]) => ({ signature, count: seeds.length, seeds, explanation: explain(signature) }))
    .sort((a, b) => b.count - a.count || a.seeds[0] - b.seeds[0]);
}

/** The whole sweep file: header, runs in seed order, statistics and failure groups. */
export function buildReport(header: SweepHeader, runs: readonly SweepRun[], explain: (signature: string) => string): SweepReport {
  // rebuilt key by key, so runs read back from shard files print in the one fixed order
  const sorted = [...runs]
    .sort((a, b) => a.seed - b.seed)
    .map((r): SweepRun => ({ seed: r.seed, outcome: r.outcome, events: r.events, time_ns: r.time_ns, delivered: r.delivered, fidelity_mean: r.fidelity_mean, signature: r.signature }));
  const limits: SweepLimits = { until_ns: header.limits.until_ns, events: header.limits.events };
  if (header.limits.breakpoints?.length) limits.breakpoints = [...header.limits.breakpoints];
  return {
    format: SWEEP_FORMAT,
    inputs: { program_set_sha256: header.inputs.program_set_sha256, noise_sha256: header.inputs.noise_sha256 },
    seeds: { from: header.seeds.from, to: header.seeds.to, shard: header.seeds.shard, count: sorted.length },
    limits,
    expectations: [...header.expectations],
    runs: sorted,
    stats: sweepStats(sorted),
    failures: groupFailures(sorted, explain),
  };
}

/** JSON on one line with a space after each colon and comma, as the format's examples are written. */
function line(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(line).join(', ')}]`;
  if (v !== null && typeof v === 'object') {
    const parts = Object.entries(v).filter(([, x]) => x !== undefined).map(([k, x]) => `${JSON.stringify(k)}: ${line(x)}`);
    return `{${parts.join(', ')}}`;
  }
  return JSON.stringify(v);
}

function list(items: readonly unknown[], indent: string): string {
  if (items.length === 0) return '[]';
  return `[\n${items.map((i) => `${indent}  ${line(i)}`).join(',\n')}\n${indent}]`;
}

/**
 * The sweep file's text: one run and one failure group per line, so large sweeps stay
 * readable and diff well. Numbers print as JSON prints them (shortest round trip).
 */
export function serializeSweep(r: SweepReport): string {
  const s = r.stats;
  const stats = [
    `"runs": ${s.runs}`,
    `"failed": ${s.failed}`,
    `"failure_rate": ${line(s.failure_rate)}`,
    `"delivered_per_run": ${line(s.delivered_per_run)}`,
    `"delivered_per_second": ${line(s.delivered_per_second)}`,
    `"fidelity": ${line(s.fidelity)}`,
  ];
  const body = [
    `"format": ${line(r.format)}`,
    `"inputs": ${line(r.inputs)}`,
    `"seeds": ${line(r.seeds)}`,
    `"limits": ${line(r.limits)}`,
    `"expectations": ${line(r.expectations)}`,
    `"runs": ${list(r.runs, '  ')}`,
    `"stats": {\n${stats.map((x) => `    ${x}`).join(',\n')}\n  }`,
    `"failures": ${list(r.failures, '  ')}`,
  ];
  return `{\n${body.map((x) => `  ${x}`).join(',\n')}\n}\n`;
}
