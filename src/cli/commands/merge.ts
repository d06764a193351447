/** `bellstep merge`: joins the sweep files of shards into the file of the whole range (docs/cli.md). */
import { junitXml } from '../../report/junit.js';
import { mergeSweeps, parseSweepFile, type NamedSweep } from '../../sweep/merge.js';
import { serializeSweep } from '../../sweep/report.js';
import { readInput } from '../inputs.js';
import { checkOutput, writeOutput } from '../outputs.js';
import { EXIT, type CommandSpec } from '../spec.js';
import { sweepSuite, sweepText } from '../sweep-output.js';

export const mergeCommand: CommandSpec = {
  name: 'merge',
  args: '<SWEEP.json...>',
  summary: 'join the sweep files of the shards of one sweep into the file of the whole range',
  options: [
    { flags: '--json', description: 'print the merged sweep file as JSON: the same bytes one sweep over the whole range gives' },
    { flags: '--junit <OUT.xml>', description: 'write a JUnit report: one failing case per signature, one passing case for the rest' },
  ],
  async run({ io }, paths, opts) {
    const junit = opts.junit === undefined ? undefined : String(opts.junit);
    if (junit !== undefined) checkOutput(io, junit, '--junit', paths, 'report.xml');
    const files: NamedSweep[] = paths.map((p) => ({ name: p, report: parseSweepFile(readInput(io, p, 'sweep file'), p) }));
    const started = new Date();
    const report = mergeSweeps(files);
    // the replays stay in the --save-failures folder of the job that ran each seed
    const hints = {};
    io.stdout(opts.json ? serializeSweep(report) : sweepText(report, hints));
    if (junit !== undefined) {
      const name = `bellstep sweep ${report.seeds.from}..${report.seeds.to} merged from ${files.length} ${files.length === 1 ? 'file' : 'files'}`;
      writeOutput(io, junit, junitXml([sweepSuite(name, report, hints, new Map(), 0, started)]), '--junit');
    }
    return report.stats.failed > 0 ? EXIT.problems : EXIT.ok;
  },
};
