/** Stall detection and the stall report: what each waiting rule still waits for. */
import { describe, expect, it } from 'vitest';
import { explainRule } from '../../src/engine/index.js';
import { runHeadless } from '../../src/session/run.js';
import { rulesView } from '../../src/tui/views/rules.js';
import { runCli } from '../helpers/run-cli.js';
import { DISAGREE_NET, engineFrom } from './scenarios.js';

describe('a purification whose ends keep different pairs', () => {
  it('ends with reason stall and names both nodes’ waiting rules', () => {
    const r = runHeadless(engineFrom(DISAGREE_NET), { seed: 1 });
    expect(r.stop.reason).toBe('stall');
    const stall = r.summary.stall!;
    expect(Object.keys(stall).sort()).toEqual(['kiln', 'weir']);
    const kiln = stall.kiln.find((e) => e.rule === 'conclude')!;
    const weir = stall.weir.find((e) => e.rule === 'conclude')!;
    // kiln kept the older pair (#1) and weir the newer (#2): each inbox holds the other one
    expect(kiln.reason).toBe('waits for a "parity" message from weir about pair kiln~weir#1; the inbox holds one about kiln~weir#2');
    expect(weir.reason).toBe('waits for a "parity" message from kiln about pair kiln~weir#2; the inbox holds one about kiln~weir#1');
    expect(kiln.kind).toBe('check');
    // the start rules wait for two link pairs and say what there is instead
    const start = stall.kiln.find((e) => e.rule === 'start')!;
    expect(start.reason).toMatch(/waits for 2 pairs with weir in stage "link"; holds 1: #3; with weir in other stages: #1 \(waiting\)/);
  });

  it('exits 1 from `bellstep run` with the report in the JSON summary', async () => {
    const res = await runCli(['run', 'stall.net.yaml', '--json'], { 'stall.net.yaml': DISAGREE_NET });
    expect(res.code).toBe(1);
    const s = JSON.parse(res.stdout);
    expect(s.stop.reason).toBe('stall');
    expect(s.stall.kiln.map((e: { rule: string }) => e.rule)).toContain('conclude');
    expect(s.stall.weir.map((e: { rule: string }) => e.rule)).toContain('conclude');
  });

  it('prints the waiting rules in words in the text report', async () => {
    const res = await runCli(['run', 'stall.net.yaml'], { 'stall.net.yaml': DISAGREE_NET });
    expect(res.code).toBe(1);
    expect(res.stdout).toContain('stalled; waiting rules:');
    expect(res.stdout).toContain('kiln.conclude: waits for a "parity" message from weir about pair kiln~weir#1');
  });
});

describe('a stall caused by a link whose slots are all held', () => {
  // a parks each half in "held", where no rule takes it; b delivers its halves at once
  const NET = `format: bellstep/program-set@1
nodes:
  - {id: alder, qubits: 1}
  - {id: birch, qubits: 1}
links:
  - {ends: [alder, birch], length: 2 km, slots: 1}
programs:
  alder:
    rules:
      - name: use
        when: [{have: {partner: birch, stage: ready, as: p}}]
        do: [{deliver: p}]
      - name: park
        when: [{have: {partner: birch, as: p}}]
        do: [{stage: {pair: p, to: held}}]
  birch:
    rules:
      - name: hand-over
        when: [{have: {partner: alder, as: q}}]
        do: [{deliver: q}]
`;

  it('names the full link, the end whose slots are held, and what holds each slot since when', () => {
    const r = runHeadless(engineFrom(NET), { seed: 1 });
    expect(r.stop.reason).toBe('stall');
    const use = r.summary.stall!.alder.find((e) => e.rule === 'use')!;
    // the herald reaches both ends 5 us after emission (1 km to the midpoint at 200,000 km/s)
    expect(use.reason).toBe(
      'waits for a pair with birch in stage "ready"; holds none; with birch in other stages: #1 (held); ' +
        'link alder~birch makes no new pairs: every slot at alder is held (1 of 1: alder~birch#1 in stage "held" since 5 us)',
    );
  });

  it('says the same in the rules pane', () => {
    const engine = engineFrom(NET);
    const r = runHeadless(engine, { seed: 1 });
    const why = explainRule(engine.net, r.world, 'alder', engine.net.rules.get('alder')![0]);
    expect(why.summary).toBe(r.summary.stall!.alder.find((e) => e.rule === 'use')!.reason);
    const lines = rulesView([{ ...why, line: 10, firedNow: false, lint: [] } as never], 'alder', 200).lines.map((l) => l.map((s) => s.text).join(''));
    expect(lines.join(' ').replace(/\s+/g, ' ')).toContain('link alder~birch makes no new pairs: every slot at alder is held (1 of 1: alder~birch#1 in stage "held" since 5 us)');
  });

  it('names both ends when both are full, as in the stalled purification', () => {
    const r = runHeadless(engineFrom(DISAGREE_NET), { seed: 1 });
    const start = r.summary.stall!.kiln.find((e) => e.rule === 'start')!;
    expect(start.reason).toMatch(/; link kiln~weir makes no new pairs: every slot at kiln is held \(2 of 2: kiln~weir#1 in stage "waiting" since [\d.]+ \w+, kiln~weir#3 in stage "link" since [\d.]+ \w+\), and every slot at weir is held \(2 of 2: kiln~weir#2 in stage "waiting"/);
  });
});
