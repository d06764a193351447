/** `bellstep sweep`: one headless run per seed of a range, on worker threads (docs/cli.md). */
import { join } from 'node:path';
import { executeSweep, sweepJob, workerCount, type SweepPlan } from '../../api/sweep.js';
import { junitXml } from '../../report/junit.js';
import { serializeSweep } from '../../sweep/report.js';
import { parseSeedRange, parseShard, shardSize } from '../../sweep/seeds.js';
import { many, parseCount, parseDurationFlag, readInputs } from '../inputs.js';
import { checkFolderOutput, checkNotInput, checkOutput, writeOutput } from '../outputs.js';
import { SweepProgress } from '../progress.js';
import { EXIT, type CommandSpec } from '../spec.js';
import { replayName, sweepSuite, sweepText, type OpenHints } from '../sweep-output.js';

export const sweepCommand: CommandSpec = {
  name: 'sweep',
  args: '<NET.yaml>',
  summary: 'run one headless run per seed of a range on worker threads, and group the failures by signature',
  options: [
    { flags: '--noise <N.yaml>', description: 'noise model (default: ideal); its seed is replaced by each seed of the range' },
    { flags: '--seeds <A..B>', description: 'the seeds to run, both ends included, e.g. 1..1000 (required)' },
    { flags: '--workers <K>', description: 'worker threads (default: one per core)' },
    { flags: '--shard <I/N>', description: 'run only the seeds at positions I-1 modulo N of the range, for job I of N' },
    { flags: '--until <DUR>', description: 'stop each run before the first event after this simulated time, e.g. 60ms' },
    { flags: '--events <N>', description: 'stop each run after this many events (default 1000000 when --until is not given)' },
    { flags: '--break <EXPR>', description: 'stop a run when this breakpoint hits (repeatable)', repeatable: true },
    { flags: '--expect <EXPR>', description: 'check this expression at the end of each run; a seed fails if it is false (repeatable)', repeatable: true },
    { flags: '--save-failures <DIR>', description: 'write DIR/seed-S.replay.json for every failing seed' },
    { flags: '--json', description: 'print the sweep file (bellstep/sweep@1) as JSON on stdout' },
    { flags: '--junit <OUT.xml>', description: 'write a JUnit report: one failing case per signature, one passing case for the rest' },
  ],
  async run({ io }, [netPath], opts) {
    const plan: SweepPlan = {
      range: parseSeedRange(opts.seeds),
      shard: parseShard(opts.shard),
      workers: workerCount(parseCount(opts.workers, '--workers'), '--workers'),
      untilNs: parseDurationFlag(opts.until, '--until'),
      maxEvents: parseCount(opts.events, '--events'),
      breaks: many(opts.break),
      expects: many(opts.expect),
      names: { break: '--break', expect: '--expect' },
    };
    const { range, shard } = plan;
    const noisePath = opts.noise as string | undefined;
    const saveDir = opts.saveFailures === undefined ? undefined : String(opts.saveFailures);
    const junit = opts.junit === undefined ? undefined : String(opts.junit);
    const job = sweepJob(readInputs(io, netPath, noisePath), plan, saveDir !== undefined);
    if (junit !== undefined) checkOutput(io, junit, '--junit', [netPath, noisePath], 'report.xml');
    if (saveDir !== undefined) {
      checkNotInput(saveDir, '--save-failures', [netPath, noisePath], io);
      checkFolderOutput(io, saveDir, '--save-failures');
    }

    const started = new Date();
    const t0 = Date.now();
    const progress = new SweepProgress(io, shardSize(range, shard));
    let writeError: unknown;
    const { report, ms } = await executeSweep(job, plan, (result) => {
      progress.seed(result.run.outcome !== 'ok');
      if (saveDir !== undefined && result.replay !== undefined && writeError === undefined) {
        // written as they come, so a long sweep keeps what it found even if stopped
        try {
          writeOutput(io, join(saveDir, replayName(result.run.seed)), result.replay, '--save-failures');
        } catch (e) {
          writeError = e;
        }
      }
    });
    progress.finish();
    const rerun = [netPath, ...(noisePath ? ['--noise', noisePath] : []), ...job.breaks.flatMap((b) => ['--break', b])];
    const hints: OpenHints = { saveDir, notSaved: saveDir === undefined, rerun };
    if (opts.json) {
      io.stdout(serializeSweep(report));
      io.stderr(`sweep: ${report.stats.runs} seeds, ${report.stats.failed} failed, ${report.failures.length} ${report.failures.length === 1 ? 'signature' : 'signatures'}\n`);
    } else io.stdout(sweepText(report, hints));
    if (writeError !== undefined) throw writeError;
    if (saveDir !== undefined && report.stats.failed > 0) io.stderr(`replays of the failing seeds written to ${saveDir}\n`);
    if (junit !== undefined) {
      const name = `bellstep sweep ${range.from}..${range.to}${shard ? ` shard ${shard.index}/${shard.count}` : ''}`;
      writeOutput(io, junit, junitXml([sweepSuite(name, report, hints, ms, Date.now() - t0, started)]), '--junit');
    }
    return report.stats.failed > 0 ? EXIT.problems : EXIT.ok;
  },
};
