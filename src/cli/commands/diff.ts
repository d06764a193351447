/** `bellstep diff A.replay.json B.replay.json [--json]`: where two recorded runs part ways (docs/cli.md). */
import { diffRuns, replaySide } from '../../report/diff.js';
import { diffText } from '../../report/diff-text.js';
import { loadRecordedRun } from '../../report/rerun.js';
import { readInput } from '../inputs.js';
import { EXIT, type CommandSpec } from '../spec.js';

export const diffCommand: CommandSpec = {
  name: 'diff',
  args: '<A.replay.json> <B.replay.json>',
  summary: 'compare two replay files event by event: the first event where they part, and what the worlds hold differently there',
  options: [{ flags: '--json', description: 'print the comparison as JSON ("bellstep/diff@1")' }],
  async run({ io }, [pathA, pathB], opts) {
    // both files are read and checked before either is re-run, so a bad second file fails fast
    const a = loadRecordedRun(pathA, readInput(io, pathA, 'replay file'));
    const b = loadRecordedRun(pathB, readInput(io, pathB, 'replay file'));
    const report = diffRuns(replaySide(a.run, a.replay), replaySide(b.run, b.replay));
    io.stdout(opts.json ? `${JSON.stringify(report, null, 2)}\n` : diffText(report, { a: pathA, b: pathB }));
    return report.same ? EXIT.ok : EXIT.problems;
  },
};
