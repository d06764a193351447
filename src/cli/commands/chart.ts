/** `bellstep chart R.json [--from I] [--to J] -o OUT.svg`: a space-time chart of a recorded run (docs/cli.md). */
import { InputError } from '../../model/errors.js';
import { chartNote, chartOfRun } from '../../report/chart.js';
import { loadRecordedRun } from '../../report/rerun.js';
import { parseIndex, readInput } from '../inputs.js';
import { checkOutput, writeOutput } from '../outputs.js';
import { EXIT, type CommandSpec } from '../spec.js';

export const chartCommand: CommandSpec = {
  name: 'chart',
  args: '<R.json>',
  summary: 'draw a space-time chart of a replay file as a standalone SVG (sites across, time going down)',
  options: [
    { flags: '--from <I>', description: 'first event to draw (default 0)' },
    { flags: '--to <J>', description: 'last event to draw (default: the last one)' },
    { flags: '-o <OUT.svg>', description: 'the SVG file to write (required)' },
  ],
  async run({ io }, [path], opts) {
    const from = parseIndex(opts.from, '--from');
    const to = parseIndex(opts.to, '--to');
    if (opts.o === undefined) throw new InputError({ code: 'usage', field: '-o', message: 'chart needs a file to write', fix: `write e.g. bellstep chart ${path} -o run.svg` });
    const out = String(opts.o);
    checkOutput(io, out, '-o', [path], 'run.svg');
    const { run } = loadRecordedRun(path, readInput(io, path, 'replay file'));
    const { svg, data } = chartOfRun(run, { from, to });
    writeOutput(io, out, svg, '-o');
    io.stderr(`${chartNote(data)}; written to ${out}\n`);
    return EXIT.ok;
  },
};
