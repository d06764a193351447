/** `bellstep replay R.json [--verify] [--json] [--junit OUT.xml]` (docs/cli.md). */
import { plural } from '../../model/words.js';
import { formatValue } from '../../expr/index.js';
import { formatDuration } from '../../model/units.js';
import { parseReplay, type ReplayFile } from '../../session/replay.js';
import { verifyReplay, type VerifyResult } from '../../session/verify.js';
import { describeExpectations, expectationLine } from '../../session/run.js';
import { sawText } from '../../session/observe.js';
import { performance } from 'node:perf_hooks';
import { junitXml, type JunitCase } from '../../report/junit.js';
import { readInput } from '../inputs.js';
import { checkOutput, writeOutput } from '../outputs.js';
import { EXIT, type CommandSpec } from '../spec.js';

/** A JUnit report of a verify: one test case for the re-run and one per expectation. */
export function junitReport(name: string, r: ReplayFile, v: VerifyResult, seconds: number, started: Date): string {
  const cases: JunitCase[] = [];
  const verify: JunitCase = { name: `verify: ${v.checked} of ${plural(r.events.length, 'event')} match the recording`, classname: 'bellstep.replay', seconds };
  cases.push(v.divergence ? { ...verify, failure: { type: 'divergence', message: v.divergence.message, text: v.divergence.message } } : verify);
  for (const e of v.expectations) {
    const value = formatValue(e.value);
    const saw = sawText(e.saw ?? []);
    cases.push({
      name: e.expr,
      classname: 'bellstep.expect',
      seconds: 0,
      failure: e.ok ? undefined : { type: 'expectation', message: `FAIL ${expectationLine(e)}`, text: `expected ${e.expr} to hold; it was ${value}${saw ? `, with ${saw}` : ''}` },
    });
  }
  return junitXml([
    {
      name,
      package: 'bellstep.replay',
      cases,
      seconds,
      timestamp: started,
      properties: [
        ['seed', String(r.seed)],
        ['program_set_sha256', r.inputs.program_set.sha256],
        ['noise_sha256', r.inputs.noise?.sha256 ?? 'none (ideal)'],
        ['stop', `${r.stop.reason}: ${r.stop.detail}`],
      ],
    },
  ]);
}

/** `all 12 events`, `the one event`, `no events`. */
function everyEvent(n: number): string {
  return n === 0 ? 'no events' : n === 1 ? 'the one event' : `all ${n} events`;
}

/** The verify's verdict in words. */
function verdict(r: ReplayFile, v: VerifyResult): string {
  if (v.divergence) {
    const head = v.divergence.field === 'stop' ? `DIVERGED: ${everyEvent(v.checked)} recorded match, but the run does not end where the recording says` : `DIVERGED after ${plural(v.checked, 'matching event')}`;
    return `${head}\n  ${v.divergence.message}\n`;
  }
  if (v.partial) return `verified up to the crash: ${everyEvent(v.checked)} match; this replay is partial (${r.stop.detail})\n`;
  return `verified: ${everyEvent(v.checked)} match the recording, and the run stops there (${r.stop.reason})\n`;
}

function describe(r: ReplayFile): string {
  const last = r.events.length ? r.events.at(r.events.length - 1) : undefined;
  return [
    `replay of ${r.inputs.program_set.file}${r.inputs.noise ? ` with ${r.inputs.noise.file}` : ''}, seed ${r.seed}, by ${r.tool.name} ${r.tool.version}`,
    `${plural(r.events.length, 'event')} up to ${formatDuration(last?.time_ns ?? 0)}; stopped: ${r.stop.reason} — ${r.stop.detail}`,
    r.breakpoints.length ? `breakpoints: ${r.breakpoints.join('; ')}` : 'breakpoints: none',
    r.expectations.length ? `expectations: ${r.expectations.join('; ')}` : 'expectations: none',
    'check it with --verify, or open it with: bellstep debug NET.yaml --replay FILE --at N',
  ].join('\n') + '\n';
}

export const replayCommand: CommandSpec = {
  name: 'replay',
  args: '<R.json>',
  summary: 'describe a replay file, or re-run it with --verify and report the first divergent event',
  options: [
    { flags: '--verify', description: 're-run the embedded inputs and compare every event' },
    { flags: '--json', description: 'print the result as JSON' },
    { flags: '--junit <OUT.xml>', description: 'write a JUnit report (one case for the verify, one per expectation)' },
  ],
  async run({ io }, [path], opts) {
    const replay = parseReplay(readInput(io, path, 'replay file'), path);
    if (!opts.verify) {
      io.stdout(opts.json ? `${JSON.stringify({ format: replay.format, seed: replay.seed, events: replay.events.length, stop: replay.stop }, null, 2)}\n` : describe(replay));
      return EXIT.ok;
    }
    const junit = opts.junit === undefined ? undefined : String(opts.junit);
    if (junit !== undefined) checkOutput(io, junit, '--junit', [path], 'report.xml');
    const started = new Date();
    const t0 = performance.now();
    const result = verifyReplay(replay);
    if (junit !== undefined) writeOutput(io, junit, junitReport(`bellstep replay ${path}`, replay, result, (performance.now() - t0) / 1000, started), '--junit');
    if (opts.json) {
      io.stdout(`${JSON.stringify({ format: 'bellstep/verify@1', ...result }, null, 2)}\n`);
    } else {
      io.stdout(verdict(replay, result));
      for (const line of describeExpectations(result.expectations)) io.stdout(`${line}\n`);
    }
    return result.ok && result.expectations.every((e) => e.ok) ? EXIT.ok : EXIT.problems;
  },
};
