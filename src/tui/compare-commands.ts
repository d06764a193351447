/**
 * The command line's `chart` and `diff`: a space-time chart of the history so far, and a
 * comparison of the session with a saved replay that moves the cursor to where they part.
 */
import { chartOfRun } from '../report/chart.js';
import { diffRuns, engineSide, replaySide } from '../report/diff.js';
import { loadRecordedRun, type RecordedRun } from '../report/rerun.js';
import { CommandError } from './command-error.js';
import type { CommandTarget } from './commands.js';

function sessionRun(t: CommandTarget): RecordedRun {
  const s = t.session;
  return { name: 'the session', engine: s.engine, seed: s.seed, events: s.history.records };
}

/** `chart FILE`: the chart of every event computed so far, written as SVG. */
export function chartCommand(t: CommandTarget, rest: string): string {
  if (!rest) throw new CommandError('chart needs a file name', 'write e.g. "chart run.svg"');
  const run = sessionRun(t);
  if (run.events.length === 0) throw new CommandError('there is nothing to draw yet', 'step or continue first, then write the chart');
  const { svg, data } = chartOfRun(run, {});
  t.writeText(rest, svg);
  return `chart of events 0–${data.to} written to ${rest}`;
}

/** `diff FILE`: compares the session with a replay file and puts the cursor on the first event where they part. */
export function diffCommand(t: CommandTarget, rest: string): string {
  if (!rest) throw new CommandError('diff needs a replay file', 'write e.g. "diff good.replay.json"');
  const { run, replay } = loadRecordedRun(rest, t.readText(rest));
  const s = t.session;
  const at = s.cursor;
  // the session computes lazily: run it as far as the recording goes, so both have the same events to compare
  if (s.total < run.events.length) s.goto(run.events.length);
  const d = diffRuns(engineSide(sessionRun(t), s.stop.reason), replaySide(run, replay));
  const differ = d.inputs_differ.length ? ` (different ${d.inputs_differ.join(', ').replace('program_set', 'program set')})` : '';
  if (d.same || d.first === null) {
    t.moved(s.goto(at));
    return `the session agrees with ${rest} on all ${d.totals.b.events} events${differ}`;
  }
  const { index, a, b } = d.first;
  t.moved(s.goto(Math.min(index + 1, s.total)));
  const here = a ? `"${a.summary}"` : 'no such event (the run ended)';
  const there = b ? `"${b.summary}"` : 'no such event (the recording ended)';
  const held = d.state.only_a.length + d.state.only_b.length;
  return `the runs part at event #${index}${differ}: here ${here}; in ${rest} ${there}${held ? `; ${held} things held differently just before it` : ''}`;
}
