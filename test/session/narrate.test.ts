import { describe, expect, it } from 'vitest';
import type { EngineEvent } from '../../src/engine/index.js';
import { formatDuration } from '../../src/model/units.js';
import { narrate } from '../../src/session/narrate.js';
import { Session } from '../../src/session/session.js';
import { engineFrom, noiseWith, purificationNet, SWAP_NET } from '../engine/scenarios.js';

/** The events of a run, stepped one by one. */
function events(net: string, noise: string, n: number): EngineEvent[] {
  const s = new Session(engineFrom(net, noise));
  const out: EngineEvent[] = [];
  while (out.length < n && s.stepForward()) out.push(s.event()!);
  return out;
}

function expectOneSentence(text: string): void {
  expect(text).not.toContain('\n');
  expect(text).toMatch(/^[A-Z]/);
  expect(text.endsWith('.')).toBe(true);
  expect(text.slice(0, -1)).not.toMatch(/\.\s+[A-Z]/);
}

const SWAP_NOISE = noiseWith('{werner: 0.9}', '    success: 0.3\n  memory: {t2: 1 s}');

describe('narrate', () => {
  it('says that nothing has happened at the start of a run', () => {
    const text = narrate(null);
    expectOneSentence(text);
    expect(text).toMatch(/start/);
  });

  it('tells a new pair by its link, id and time, and that no rule fired', () => {
    const ev = events(SWAP_NET, SWAP_NOISE, 4).find((e) => e.type === 'herald' && e.fires.length === 0)!;
    const text = narrate(ev);
    expectOneSentence(text);
    const [a, b] = ev.pair!.slice(0, ev.pair!.indexOf('#')).split('~');
    expect(text).toContain(`At ${formatDuration(ev.time)}`);
    expect(text).toContain(`${a}–${b} link`);
    expect(text).toContain(ev.pair!.slice(ev.pair!.indexOf('#')));
    expect(text).toContain('no rule fired');
  });

  it('tells a swap: who ran which rule, the Bell-state measurement and the messages sent', () => {
    const ev = events(SWAP_NET, SWAP_NOISE, 8).find((e) => e.fires.some((f) => f.rule === 'swap'))!;
    const text = narrate(ev);
    expectOneSentence(text);
    expect(text).toContain('mill ran swap');
    expect(text).toContain('Bell-measured');
    for (const s of ev.sends) expect(text).toContain(`sent a "${s.kind}" message to ${s.to}`);
  });

  it('tells an arrival: the kind, sender and receiver, and what the receiving rule did', () => {
    const ev = events(SWAP_NET, SWAP_NOISE, 8).find((e) => e.type === 'arrive' && e.fires.some((f) => f.node === 'ridge'))!;
    const text = narrate(ev);
    expectOneSentence(text);
    expect(text).toContain('a "swapped" message from mill reached ridge');
    expect(text).toContain('ridge ran fix-up');
    expect(text).toMatch(/relabelled #\d+ as #\d+\+\d+, now shared with quay/);
    expect(text).toMatch(/completing the pair at fidelity 0\.\d{3}/);
  });

  it('tells a purification step as a gate and a measurement with its outcome', () => {
    const ev = events(purificationNet(), noiseWith('{werner: 0.9}', '    success: 0.5'), 6).find((e) => e.fires.some((f) => f.rule === 'start'))!;
    const text = narrate(ev);
    expectOneSentence(text);
    expect(text).toMatch(/applied cnot from #\d+ onto #\d+/);
    expect(text).toMatch(/measured #\d+ in the z basis and got [01]/);
    expect(text).toMatch(/moved #\d+ to stage "waiting"/);
  });

  it('says when a message was lost, and why', () => {
    const noise = noiseWith('{werner: 0.9}', '    success: 0.5\nfaults:\n  - drop: {from: kiln, to: weir, kind: parity, nth: 1}');
    const ev = events(purificationNet(), noise, 10).find((e) => e.sends.some((s) => s.dropped))!;
    const text = narrate(ev);
    expectOneSentence(text);
    expect(text).toContain('the "parity" message from kiln to weir was lost');
    expect(text).toContain('fault');
  });

  it('tells a message that no rule could use yet, and a wake-up', () => {
    const arrive: EngineEvent = {
      index: 3, time: 1_500_000, type: 'arrive', node: 'fen', nodes: ['fen'], summary: 'fen got ping from vale about #4',
      fires: [], sends: [], deliveries: [], discards: [], delivers: [], message: 2,
    };
    const a = narrate(arrive);
    expectOneSentence(a);
    expect(a).toBe('At 1.5 ms, a "ping" message from vale reached fen about pair #4, and no rule could use it yet, so it waits in the inbox.');
    const wake: EngineEvent = { ...arrive, type: 'wake', node: 'loft', nodes: ['loft'], summary: 'loft woke (min_age reached)', message: undefined };
    expect(narrate(wake)).toBe('At 1.5 ms, loft woke up (min_age reached), and no rule fired.');
  });

  it('spells out a Pauli correction in the order it is applied', () => {
    const ev: EngineEvent = {
      index: 0, time: 250, type: 'arrive', node: 'ridge', nodes: ['ridge'], summary: 'ridge got swapped from mill about #1; fired ridge.fix-up',
      fires: [{ node: 'ridge', rule: 'fix-up', bound: {}, actions: ['corrected #1 (XZ)', 'corrected #2 (none)'], log: ['done'] }],
      sends: [], deliveries: [], discards: [], delivers: [],
    };
    const text = narrate(ev);
    expect(text).toContain('corrected #1 with X then Z');
    expect(text).toContain('found that #2 needed no correction');
    expect(text).toContain('logged "done"');
  });
});
