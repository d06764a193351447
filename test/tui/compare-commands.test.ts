/** The debugger's `chart` and `diff` commands: a chart of the history so far, and a jump to where a saved run parts. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { openSessionWith } from '../../src/api/session.js';
import { loadText } from '../../src/api/inputs.js';
import type { DiffReport } from '../../src/report/diff.js';
import { Controller } from '../../src/tui/controller.js';
import { runCli } from '../helpers/run-cli.js';

const NET = 'demos/nested-repeater/repeater.net.yaml';
const NOISE = 'demos/nested-repeater/repeater.noise.yaml';
const DROP = 'faults:\n  - drop: {from: birch, to: cedar, kind: swapped, nth: 2}\n';
const files = { [NET]: readFileSync(NET, 'utf8'), [NOISE]: readFileSync(NOISE, 'utf8'), 'drop.noise.yaml': `${readFileSync(NOISE, 'utf8')}${DROP}` };

function debuggerWith(store: Map<string, string>): Controller {
  const session = openSessionWith(loadText({ programSet: files[NET], noise: files[NOISE], programSetFile: NET, noiseFile: NOISE }));
  return new Controller(session, {
    defer: (fn) => fn(),
    writeFile: (p, t) => void store.set(p, t),
    readFile: (p) => {
      const t = store.get(p);
      if (t === undefined) throw new Error(`ENOENT: no such file or directory, open '${p}'`);
      return t;
    },
  });
}

describe('the chart command', () => {
  it('writes the chart of every event computed so far, one arrow per message sent', () => {
    const store = new Map<string, string>();
    const c = debuggerWith(store);
    c.submit('chart early.svg');
    expect(c.command.hint?.lines[0]).toBe('there is nothing to draw yet');
    c.submit('step 80');
    let sent = 0;
    for (let i = 1; i <= 80; i++) {
      c.session.goto(i);
      sent += c.session.event()!.sends.length;
    }
    c.submit('chart run.svg');
    expect(c.note?.lines[0]).toBe('chart of events 0–79 written to run.svg');
    const svg = store.get('run.svg')!;
    expect(svg.startsWith('<?xml')).toBe(true);
    expect(sent).toBeGreaterThan(10);
    expect(svg.match(/<g class="msg( lost)?">/g)).toHaveLength(sent);
  });
});

describe('the diff command', () => {
  it('compares the session with a saved run and puts the cursor on the first event where they part', async () => {
    const a = await runCli(['run', NET, '--noise', NOISE, '--until', '8ms', '--record', 'a.json'], files);
    const b = await runCli(['run', NET, '--noise', 'drop.noise.yaml', '--until', '8ms', '--record', 'b.json'], files);
    const store = new Map([['a.json', a.files.get('a.json')!], ['b.json', b.files.get('b.json')!]]);
    const expected = JSON.parse((await runCli(['diff', 'a.json', 'b.json', '--json'], Object.fromEntries(store))).stdout) as DiffReport;
    const c = debuggerWith(store);
    c.submit('step 3');
    c.submit('diff b.json');
    expect(c.note?.lines[0]).toMatch(new RegExp(`^the runs part at event #${expected.first!.index} \\(different noise\\): here "cedar got swapped from birch`));
    expect(c.session.cursor).toBe(expected.first!.index + 1);
    expect(c.session.event()!.summary).toBe(expected.first!.a!.summary);
  });

  it('says when the session agrees with the file, and leaves the cursor where it was', async () => {
    const a = await runCli(['run', NET, '--noise', NOISE, '--events', '120', '--record', 'a.json'], files);
    const c = debuggerWith(new Map([['a.json', a.files.get('a.json')!]]));
    c.submit('step 5');
    c.submit('diff a.json');
    expect(c.note?.lines[0]).toBe('the session agrees with a.json on all 120 events');
    expect(c.session.cursor).toBe(5);
  });

  it('shows a missing or broken file as the command’s error and keeps the line open', () => {
    const c = debuggerWith(new Map([['x.json', '{"format": "bellstep/replay@1"']]));
    c.submit('diff nope.json');
    expect(c.mode).toBe('command');
    expect(c.command.hint?.lines[0]).toMatch(/^could not read nope\.json/);
    c.submit('diff x.json');
    expect(c.command.hint?.lines[0]).toContain('truncated');
  });
});
