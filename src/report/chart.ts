/** The space-time chart of a recorded run: `bellstep chart` and the debugger's `chart` command both come here. */
import { chartData, resolveRange, type ChartData, type ChartRange } from './chart-data.js';
import { renderChart } from './chart-svg.js';
import type { RecordedRun } from './rerun.js';

export { chartNote, FULL_LIMIT } from './chart-svg.js';
export type { ChartData, ChartRange } from './chart-data.js';

/** Re-runs the recorded run, checking it event by event, and draws the range as SVG. */
export function chartOfRun(run: RecordedRun, range: ChartRange, names?: { from: string; to: string }): { svg: string; data: ChartData } {
  const data = chartData(run, resolveRange(range, run.events.length, names));
  return { svg: renderChart(data), data };
}
