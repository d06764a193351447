/**
 * What the demos' READMEs say about a run is what the run does: the event counts they quote
 * (in words or in figures) are checked against the real CLI.
 */
import { describe, expect, it } from 'vitest';
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
});
