/**
 * Words a person can read: counts agree with their nouns, kinds that start with a vowel take
 * "an", and the debugger's stop line says where it is once.
 */
import { describe, expect, it } from 'vitest';
import { narrate } from '../../src/session/narrate.js';
import { Session } from '../../src/session/session.js';
import { networkView } from '../../src/tui/views/network.js';
import { Controller } from '../../src/tui/controller.js';
import { DISAGREE_NET, engineFrom, noiseWith, SWAP_NET } from '../engine/scenarios.js';
import { loadDemo } from '../demos/demo-files.js';
import { runCli } from '../helpers/run-cli.js';

describe('words', () => {
  it('says "1 link" and "2 sites" in the sites pane', () => {
    const engine = engineFrom(DISAGREE_NET);
    expect(networkView(engine.net, engine.initial(), 'kiln', 80).note).toBe('2 sites, 1 link');
  });

  it('says "an" before a kind that starts with a vowel', () => {
    const demo = loadDemo('lost-message');
    const session = new Session(engineFrom(demo.net, demo.noise));
    session.addBreakpoint('on fire tarn.abandon');
    session.continue();
    const text = narrate(session.event());
    expect(text).toContain('an "abandon" message from vale reached tarn');
    expect(text).not.toMatch(/\ba "abandon"/);
  });

  it('says "1 pair" when one pair was delivered', async () => {
    const r = await runCli(['run', 'n.net.yaml', '--break', 'delivered() >= 1'], { 'n.net.yaml': SWAP_NET });
    expect(r.stdout).toMatch(/^delivered: 1 pair, fidelity mean/m);
  });

  it('names the event once in the line after a move', () => {
    const c = new Controller(new Session(engineFrom(DISAGREE_NET, noiseWith('{werner: 0.9}'))), { defer: (fn) => fn() });
    const stop = c.session.continue();
    const line = c.moved(stop);
    expect(line).toBe(`at event #${c.session.cursor - 1}: the network stalled after ${c.session.cursor} events`);
    expect(line.match(/event/g)).toHaveLength(2);
  });
});
