/**
 * `bellstep diff`: two runs that differ by one dropped message part exactly where the lost
 * message would have arrived; identical runs agree (exit 0); a run cut short parts where it
 * ends; bad files are exit 2 naming the file.
 */
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { Engine } from '../../src/engine/index.js';
import { loadInputs } from '../../src/model/index.js';
import { runHeadless } from '../../src/session/run.js';
import type { DiffReport } from '../../src/report/diff.js';
import { runCli } from '../helpers/run-cli.js';

const NET = 'demos/nested-repeater/repeater.net.yaml';
const NOISE = 'demos/nested-repeater/repeater.noise.yaml';
const DROP = 'faults:\n  - drop: {from: birch, to: cedar, kind: swapped, nth: 2}\n';
const files = { [NET]: readFileSync(NET, 'utf8'), [NOISE]: readFileSync(NOISE, 'utf8'), 'drop.noise.yaml': `${readFileSync(NOISE, 'utf8')}${DROP}` };

async function record(noise: string, out: string, ...flags: string[]): Promise<string> {
  const r = await runCli(['run', NET, '--noise', noise, '--until', '8ms', ...flags, '--record', out], files);
  expect(r.code).toBe(0);
  return r.files.get(out)!;
}

/** The index of the event at which the second "swapped" message from birch to cedar arrives, in the run without the fault. */
function arrivalOfDropped(): number {
  const { programSet, noise } = loadInputs({ netFile: NET, netText: files[NET], noiseFile: NOISE, noiseText: files[NOISE] });
  const ids: number[] = [];
  let index = -1;
  runHeadless(new Engine(programSet, noise), {
    seed: noise.seed,
    untilNs: 8_000_000,
    onEvent: (ev) => {
      for (const s of ev.sends) if (s.from === 'birch' && s.to === 'cedar' && s.kind === 'swapped') ids.push(s.id);
      if (index < 0 && ev.type === 'arrive' && ev.message === ids[1]) index = ev.index;
    },
  });
  return index;
}

const replays: Record<string, string> = {};
beforeAll(async () => {
  replays['a.json'] = await record(NOISE, 'a.json');
  replays['b.json'] = await record('drop.noise.yaml', 'b.json');
  replays['short.json'] = await record(NOISE, 'short.json', '--events', '50');
  replays['seed.json'] = await record(NOISE, 'seed.json', '--seed', '5');
});

describe('bellstep diff', () => {
  it('names the first event at which two runs differing by one dropped message part', async () => {
    const r = await runCli(['diff', 'a.json', 'b.json', '--json'], replays);
    expect(r.code).toBe(1);
    const d = JSON.parse(r.stdout) as DiffReport;
    const expected = arrivalOfDropped();
    expect(expected).toBeGreaterThan(0);
    expect(d.same).toBe(false);
    expect(d.inputs_differ).toEqual(['noise']);
    expect(d.first!.index).toBe(expected);
    expect(d.first!.a!.summary).toMatch(/^cedar got swapped from birch/);
    expect(d.first!.b!.summary).not.toMatch(/^cedar got swapped from birch/);
    // just before it, A still has the message on its way and B does not
    expect(d.state.only_a.some((s) => /^message swapped birch→cedar about \S+ in flight/.test(s))).toBe(true);
    expect(d.state.only_b.some((s) => s.includes('swapped birch→cedar'))).toBe(false);
    expect(d.totals.a.delivered).toBeGreaterThan(d.totals.b.delivered);
    expect(Object.keys(d)).toEqual(['format', 'same', 'inputs_differ', 'first', 'state', 'totals']);
    expect(d.format).toBe('bellstep/diff@1');
  });

  it('ends its text with the commands that open each run at that event', async () => {
    const r = await runCli(['diff', 'a.json', 'b.json'], replays);
    expect(r.code).toBe(1);
    const i = arrivalOfDropped();
    expect(r.stdout).toContain(`the runs part at event ${i}`);
    expect(r.stdout).toContain('inputs that differ: the noise model');
    expect(r.stdout.trimEnd().split('\n').slice(-2)).toEqual([`  bellstep debug --replay a.json --at ${i}`, `  bellstep debug --replay b.json --at ${i}`]);
  });

  it('exits 0 for identical runs', async () => {
    const r = await runCli(['diff', 'a.json', 'a.json', '--json'], replays);
    expect(r.code).toBe(0);
    const d = JSON.parse(r.stdout) as DiffReport;
    expect(d).toMatchObject({ same: true, inputs_differ: [], first: null, state: { only_a: [], only_b: [] } });
    expect(d.totals.a).toEqual(d.totals.b);
    const text = await runCli(['diff', 'a.json', 'a.json'], replays);
    expect(text.stdout).toContain(`the runs agree: all ${d.totals.a.events} events match`);
  });

  it('parts where a run cut short ends, and opens that run at its last event', async () => {
    const r = await runCli(['diff', 'short.json', 'a.json', '--json'], replays);
    expect(r.code).toBe(1);
    const d = JSON.parse(r.stdout) as DiffReport;
    expect(d.inputs_differ).toEqual([]);
    expect(d.first).toMatchObject({ index: 50, a: null });
    expect(d.totals.a).toMatchObject({ events: 50, stop: 'events' });
    const text = await runCli(['diff', 'short.json', 'a.json'], replays);
    expect(text.stdout).toContain('A  no event 50: the run stopped after 50 events (events)');
    expect(text.stdout).toContain('bellstep debug --replay short.json --at 49');
  });

  it('names the seed when seeds differ', async () => {
    const d = JSON.parse((await runCli(['diff', 'a.json', 'seed.json', '--json'], replays)).stdout) as DiffReport;
    expect(d.inputs_differ).toEqual(['seed']);
    expect(d.same).toBe(false);
  });

  it('refuses files that are not replays, naming them (exit 2, no stack trace)', async () => {
    const bad = await runCli(['diff', 'a.json', 'x.json'], { ...replays, 'x.json': '{"format": "something/else@1"}' });
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('x.json');
    expect(bad.stderr).toContain('not a bellstep replay file');
    const missing = await runCli(['diff', 'nope.json', 'a.json'], replays);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain('nope.json');
    expect(missing.stderr).not.toMatch(/\n\s+at /);
  });
});
