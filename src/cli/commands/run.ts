/** `bellstep run`: the headless run that CI and scripts use (docs/cli.md). */
import { executeRun, prepareRun, type RunPlan, type RunSummary } from '../../api/run.js';
import { deliveredCount, eachDelivery, type World } from '../../engine/index.js';
import { plural } from '../../model/words.js';
import { formatDuration } from '../../model/units.js';
import { statsTable } from '../../report/stats-text.js';
import { DEFAULT_MAX_EVENTS, describeExpectations, runHeadless } from '../../session/run.js';
import { writeSummaryJson } from '../../session/summary.js';
import { Recorder } from '../../session/replay.js';
import { crashReplayPath, onCrashSaveReplay } from '../crash.js';
import { checkOutput, openOutput } from '../outputs.js';
import { many, parseCount, parseDurationFlag, parseSeed, readInputs } from '../inputs.js';
import { EXIT, type CommandSpec } from '../spec.js';

function textReport(s: RunSummary, w: World): string {
  const lines: string[] = [];
  lines.push(`stopped: ${s.stop.reason} — ${s.stop.detail}`);
  lines.push(`events: ${s.events}   simulated time: ${formatDuration(s.time_ns)}   seed: ${s.seed}`);
  const gen = Object.entries(s.generated).map(([k, v]) => `${k} ${v}`).join(', ');
  lines.push(`pairs generated: ${gen || 'none'}`);
  lines.push(`messages: ${s.messages.sent} sent, ${s.messages.delivered} arrived, ${s.messages.dropped} lost`);
  const count = deliveredCount(w);
  if (count) {
    let sum = 0;
    let min = Infinity;
    for (const d of eachDelivery(w)) {
      sum += d.fidelity;
      min = Math.min(min, d.fidelity);
    }
    lines.push(`delivered: ${plural(count, 'pair')}, fidelity mean ${(sum / count).toFixed(4)}, min ${min.toFixed(4)}`);
  } else lines.push('delivered: none');
  for (const [node, rules] of Object.entries(s.fired)) {
    lines.push(`  ${node}: ${Object.entries(rules).map(([r, n]) => `${r} ×${n}`).join(', ')}`);
  }
  if (s.stall) {
    lines.push('', 'stalled; waiting rules:');
    for (const [node, entries] of Object.entries(s.stall)) {
      for (const e of entries) lines.push(`  ${node}.${e.rule}${e.from ? ` from ${e.from}` : ''}: ${e.reason}`);
    }
  }
  lines.push('', ...statsTable(s.stats));
  if (s.expectations.length) lines.push('', 'expectations:', ...describeExpectations(s.expectations).map((l) => `  ${l}`));
  return lines.join('\n') + '\n';
}

export const runCommand: CommandSpec = {
  name: 'run',
  args: '<NET.yaml>',
  summary: 'run a program set headless and print a summary (for CI and scripts)',
  options: [
    { flags: '--noise <N.yaml>', description: 'noise model (default: ideal)' },
    { flags: '--seed <S>', description: "seed (overrides the noise model's)" },
    { flags: '--until <DUR>', description: 'stop before the first event after this simulated time, e.g. 60ms' },
    { flags: '--events <N>', description: 'stop after this many events (default 1000000 when --until is not given)' },
    { flags: '--break <EXPR>', description: 'stop when this breakpoint hits (repeatable)', repeatable: true },
    { flags: '--expect <EXPR>', description: 'check this expression at the end; exit 1 if false (repeatable)', repeatable: true },
    { flags: '--record <R.json>', description: 'write a replay file of the run' },
    { flags: '--json', description: 'print the run summary as JSON (bellstep/run-summary@1, with run statistics)' },
  ],
  async run({ io }, [netPath], opts) {
    const plan: RunPlan = {
      seed: parseSeed(opts.seed),
      untilNs: parseDurationFlag(opts.until, '--until'),
      maxEvents: parseCount(opts.events, '--events'),
      breaks: many(opts.break),
      expects: many(opts.expect),
      names: { break: '--break', expect: '--expect' },
    };
    const recordPath = opts.record === undefined ? undefined : String(opts.record);
    // refused before anything is read or run: a replay written over its own program set would lose it
    if (recordPath !== undefined) checkOutput(io, recordPath, '--record', [netPath, opts.noise as string | undefined], 'run.replay.json');
    const prepared = prepareRun(readInputs(io, netPath, opts.noise as string | undefined), plan);
    const { engine, seed } = prepared;
    const meta = {
      seed,
      breakpoints: prepared.breakpoints.map((b) => b.spec),
      expectations: prepared.expectations.map((e) => e.spec),
      limits: { until_ns: plan.untilNs ?? null, events: plan.maxEvents ?? (plan.untilNs === undefined ? DEFAULT_MAX_EVENTS : null) },
    };
    // the recording streams to its file as the run goes, so its memory does not grow
    const file = recordPath === undefined ? undefined : openOutput(io, recordPath, '--record');
    const recorder = file ? new Recorder(engine, meta, (chunk) => file.write(chunk)) : undefined;
    // an internal error saves a replay of the run so far: the recording if there is one, else
    // a fresh recording of the events that completed (the engine is deterministic)
    let completed = 0;
    onCrashSaveReplay((why) => {
      if (recorder && file && recordPath) {
        recorder.partial(why);
        file.close();
        return recordPath;
      }
      const path = crashReplayPath(io);
      const out = io.openWrite(path);
      const again = new Recorder(engine, meta, (chunk) => out.write(chunk));
      runHeadless(engine, { seed, maxEvents: completed, onEvent: (ev, w) => again.add(ev, w) });
      again.partial(why);
      out.close();
      return path;
    });

    const started = Date.now();
    let lastProgress = started;
    const progress = (events: number, t: number) => {
      const now = Date.now();
      if (now - lastProgress < 1000) return;
      lastProgress = now;
      const line = `… ${plural(events, 'event')}, simulated ${formatDuration(t)}`;
      if (io.stdoutIsTTY) io.stdout(`\r${line}`);
      else io.stderr(`${line}\n`);
    };
    const { result, stats } = executeRun(prepared, {
      onEvent: recorder
        ? (ev, w) => {
            completed++;
            recorder.add(ev, w);
          }
        : () => void completed++,
      onBatch: (w) => progress(w.events, w.time),
    });
    if (io.stdoutIsTTY && lastProgress !== started) io.stdout('\r\x1b[K');
    onCrashSaveReplay(undefined);
    if (recorder && file) {
      recorder.finish(result.stop);
      file.close();
      io.stderr(`replay written to ${recordPath}\n`);
    }
    // the head: the summary without its delivery records (then the statistics), and the
    // records are read from the world as they are written, so memory does not grow with them
    const s: RunSummary = { ...result.head, stats };
    if (opts.json) writeSummaryJson(s, result.world, (chunk) => io.stdout(chunk));
    else io.stdout(textReport(s, result.world));
    const failed = s.expectations.some((e) => !e.ok);
    return s.stop.reason === 'stall' || failed ? EXIT.problems : EXIT.ok;
  },
};
