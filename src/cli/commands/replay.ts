/** `bellstep replay R.json [--verify] [--json] [--junit OUT.xml]` (FORMAT.md §5, §7). */
import { formatValue } from '../../expr/index.js';
import { formatDuration } from '../../model/units.js';
import { parseReplay, type ReplayFile } from '../../session/replay.js';
import { verifyReplay, type VerifyResult } from '../../session/verify.js';
import { readInput } from '../inputs.js';
import { EXIT, type CommandSpec } from '../spec.js';

function xml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** A JUnit report: one test case for the verify and one per expectation. */
export function junitReport(name: string, r: VerifyResult): string {
  const cases: string[] = [];
  const verify = r.divergence
    ? `<failure message="${xml(r.divergence.message)}">${xml(r.divergence.message)}</failure>`
    : '';
  cases.push(`    <testcase classname="bellstep.replay" name="verify: ${r.checked} events match the recording">${verify}</testcase>`);
  for (const e of r.expectations) {
    const fail = e.ok ? '' : `<failure message="${xml(`${e.expr} was ${formatValue(e.value)}`)}">${xml(`expected ${e.expr} to hold; value ${formatValue(e.value)}`)}</failure>`;
    cases.push(`    <testcase classname="bellstep.expect" name="${xml(e.expr)}">${fail}</testcase>`);
  }
  const failures = (r.divergence ? 1 : 0) + r.expectations.filter((e) => !e.ok).length;
  return (
    `<?xml version="1.0" encoding="UTF-8"?>\n<testsuites>\n  <testsuite name="${xml(name)}" tests="${cases.length}" failures="${failures}">\n` +
    `${cases.join('\n')}\n  </testsuite>\n</testsuites>\n`
  );
}

function describe(r: ReplayFile): string {
  const last = r.events[r.events.length - 1];
  return [
    `replay of ${r.inputs.program_set.file}${r.inputs.noise ? ` with ${r.inputs.noise.file}` : ''}, seed ${r.seed}, by ${r.tool.name} ${r.tool.version}`,
    `${r.events.length} events up to ${formatDuration(last?.time_ns ?? 0)}; stopped: ${r.stop.reason} — ${r.stop.detail}`,
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
    const result = verifyReplay(replay);
    if (opts.junit) io.writeFile(String(opts.junit), junitReport(`bellstep replay ${path}`, result));
    if (opts.json) {
      io.stdout(`${JSON.stringify({ format: 'bellstep/verify@1', ...result }, null, 2)}\n`);
    } else {
      io.stdout(result.divergence ? `DIVERGED after ${result.checked} matching events\n  ${result.divergence.message}\n` : `verified: all ${result.checked} events match the recording\n`);
      for (const e of result.expectations) io.stdout(`${e.ok ? 'ok  ' : 'FAIL'} ${e.expr}  (${formatValue(e.value)})\n`);
    }
    return result.ok && result.expectations.every((e) => e.ok) ? EXIT.ok : EXIT.problems;
  },
};
