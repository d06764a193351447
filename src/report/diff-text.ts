/** The comparison of two runs as text for a terminal, ending with the commands that open each run at the split. */
import { formatDuration } from '../model/units.js';
import type { DiffReport, DiffTotals } from './diff.js';
import { textTable } from './table.js';

/** A path as a shell word: plain when it is safe, else in single quotes. */
export function shellWord(s: string): string {
  return /^[A-Za-z0-9_./:@%+=,-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`;
}

function totals(t: DiffTotals): string {
  return `${t.events} events, ${t.delivered} delivered, stopped: ${t.stop}`;
}

const INPUT_WORDS = { program_set: 'the program set', noise: 'the noise model', seed: 'the seed' } as const;

/** The command that opens a replay file in the debugger at an event; none for a run with no events. */
export function openCommand(file: string, index: number, events: number): string | undefined {
  if (events === 0) return undefined;
  return `bellstep debug --replay ${shellWord(file)} --at ${Math.min(index, events - 1)}`;
}

/** The report as text; `files` name the two replay files. */
export function diffText(d: DiffReport, files: { a: string; b: string }): string {
  const lines: string[] = [];
  lines.push(...textTable(['', 'run', 'totals'], [['A', files.a, totals(d.totals.a)], ['B', files.b, totals(d.totals.b)]]).slice(1));
  lines.push(d.inputs_differ.length ? `inputs that differ: ${d.inputs_differ.map((k) => INPUT_WORDS[k]).join(', ')}` : 'inputs: the same program set, noise model and seed');
  if (d.same || d.first === null) {
    lines.push(`the runs agree: all ${d.totals.a.events} events match in time, site, kind and text`);
    return `${lines.join('\n')}\n`;
  }
  const { index, a, b } = d.first;
  const at = a ?? b!;
  lines.push('', `the runs part at event ${index}, at ${formatDuration(at.time_ns)}${index > 0 ? ` (events 0 to ${index - 1} agree)` : ''}:`);
  const side = (e: typeof a, t: DiffTotals) => (e ? `${formatDuration(e.time_ns)}  ${e.summary}` : `no event ${index}: the run stopped after ${t.events} events (${t.stop})`);
  lines.push(`  A  ${side(a, d.totals.a)}`, `  B  ${side(b, d.totals.b)}`);
  const { only_a, only_b } = d.state;
  if (only_a.length || only_b.length) {
    lines.push('', 'held differently just before it:');
    for (const s of only_a) lines.push(`  only in A  ${s}`);
    for (const s of only_b) lines.push(`  only in B  ${s}`);
  } else lines.push('', 'just before it, both worlds hold the same pairs and messages');
  const commands = [openCommand(files.a, index, d.totals.a.events), openCommand(files.b, index, d.totals.b.events)].filter((c): c is string => c !== undefined);
  if (commands.length) lines.push('', 'open each run at that event:', ...commands.map((c) => `  ${c}`));
  return `${lines.join('\n')}\n`;
}
