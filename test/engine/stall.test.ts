/** Stall detection and the stall report: what each waiting rule still waits for. */
import { describe, expect, it } from 'vitest';
import { runHeadless } from '../../src/session/run.js';
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
