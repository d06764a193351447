/**
 * What the demos' READMEs say about a run is what the run does: the event counts they quote
 * (in words or in figures) are checked against the real CLI.
 */
import { describe, expect, it } from 'vitest';
import { parseDocument } from 'yaml';
import { parseDuration } from '../../src/model/units.js';
import { loadDemo, runJson, withoutRules } from './demo-files.js';

const NUMBERS: Record<string, number> = { one: 1, two: 2, three: 3, four: 4, five: 5, six: 6, seven: 7, eight: 8, nine: 9, ten: 10 };
const count = (w: string): number => NUMBERS[w] ?? Number(w);

describe('what the demo READMEs say', () => {
  it('stalled-purification stalls after the number of events its summary and its steps give', async () => {
    const demo = loadDemo('stalled-purification');
    const { s } = await runJson(demo, []);
    expect(s.stop.reason).toBe('stall');
    const said = [...demo.readme.matchAll(/stalls after (\w+) events|at the stall \((\d+) events\)/g)].map((m) => count(m[1] ?? m[2]));
    expect(said).toHaveLength(2);
    for (const n of said) expect(n).toBe(s.events);
  });

  it('lost-message stalls without its time-out after the number of events it gives', async () => {
    const demo = loadDemo('lost-message');
    const m = /stalled after (\w+) events/.exec(demo.readme);
    expect(m).not.toBeNull();
    const net = withoutRules(withoutRules(demo.net, 'vale', ['give-up']), 'tarn', ['abandon']);
    const { s } = await runJson(demo, ['--until', '200ms'], { net });
    expect(s.stop.reason).toBe('stall');
    expect(s.events).toBe(count(m![1]));
  });

  it('lost-message gives up as often as it says with min_age instead of min_wait, and once with min_wait', async () => {
    const demo = loadDemo('lost-message');
    const m = /over 5 s it gave up (\w+) times for one lost message/.exec(demo.readme);
    expect(m).not.toBeNull();
    const withAge = demo.net.replace('min_wait: 3 ms', 'min_age: 3 ms');
    expect(withAge).not.toBe(demo.net);
    const age = (await runJson(demo, ['--until', '5s'], { net: withAge })).s;
    expect(age.fired.vale['give-up']).toBe(count(m![1]));
    expect(age.messages.dropped).toBe(1);
    const wait = (await runJson(demo, ['--until', '5s'])).s;
    expect(wait.fired.vale['give-up']).toBe(1);
    expect(demo.readme).toContain('gives up exactly once');
  });

  it('lost-message names the 94 µs that start takes before the kept half enters waiting', () => {
    const demo = loadDemo('lost-message');
    const d = (k: string) => parseDuration(String(parseDocument(demo.noise).getIn(['defaults', 'gates', k, 'duration'])));
    expect(demo.readme).toContain('94 µs after the event that fired');
    expect(2 * d('single') + d('two') + d('measure')).toBe(94_000);
  });
});

