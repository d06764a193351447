/** Run statistics as a short text table, for `bellstep run` on a terminal or in a CI log. */
import { formatDuration } from '../model/units.js';
import type { RunStats } from '../session/run-stats.js';
import { figure, textTable } from './table.js';

function duration(ns: number | null): string {
  return ns === null ? '–' : formatDuration(Math.round(ns));
}

function share(v: number | null): string {
  return v === null ? '–' : `${figure(v * 100, 1)} %`;
}

/** The statistics in a few aligned lines: delivered pairs, fidelity and latency, then one row per link. */
export function statsTable(s: RunStats): string[] {
  const f = s.fidelity;
  const l = s.latency_ns;
  const figures = textTable(
    ['', 'mean', 'min', 'p5', 'p50', 'p95', 'max'],
    [
      ['fidelity', figure(f.mean), figure(f.min), figure(f.p5), figure(f.p50), figure(f.p95), ''],
      ['latency', duration(l.mean), '', '', duration(l.p50), duration(l.p95), duration(l.max)],
    ],
    ['left', 'right', 'right', 'right', 'right', 'right', 'right'],
  );
  const links = textTable(
    ['link', 'pairs per second', 'slots full'],
    Object.entries(s.links).map(([id, v]) => [id, figure(v.generated_per_second, 2), share(v.slots_full_share)]),
    ['left', 'right', 'right'],
  );
  return [`run statistics: ${figure(s.delivered_per_second, 2)} pairs delivered per second of simulated time`, ...figures.map((x) => `  ${x}`), '', ...links.map((x) => `  ${x}`)];
}
