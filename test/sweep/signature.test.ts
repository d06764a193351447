/** Failure signatures: seed-specific detail out, the failing rule, guard and expectation in. */
import { describe, expect, it } from 'vitest';
import type { StallEntry } from '../../src/engine/index.js';
import { diagnoseExpectations, diagnoseRunError, diagnoseStall, normaliseDetail } from '../../src/sweep/signature.js';

describe('normaliseDetail', () => {
  it('takes out pair ids, keeping the link, and collapses lists of them', () => {
    expect(normaliseDetail('waits for a "parity" message from weir about pair kiln~weir#12; the inbox holds one about kiln~weir#13')).toBe(
      'waits for a "parity" message from weir about pair kiln~weir#*; the inbox holds N about kiln~weir#*',
    );
    expect(normaliseDetail('holds 3: #4, #7, #9')).toBe('holds N: #*');
    expect(normaliseDetail('holds 9: #1, #2, #3, #4 and 5 more')).toBe('holds N: #*');
    expect(normaliseDetail('pair quay~ridge#3+4 is gone')).toBe('pair quay~ridge#* is gone');
  });

  it('takes out times and counts, but not digits inside names nor the count a guard asks for', () => {
    expect(normaliseDetail('node busy until 1.25 ms; then: 2 parity in flight, the first arriving in 40 us')).toBe('node busy until T; then: N parity in flight, the first arriving in T');
    expect(normaliseDetail('waits for 2 pairs with s2 in stage "link"; holds 1: #5')).toBe('waits for 2 pairs with s2 in stage "link"; holds N: #*');
    expect(normaliseDetail('check "m.bit == keep.bit" is false (m.bit = 0, keep.bit = 1)')).toBe('check "m.bit == keep.bit" is false (m.bit = N, keep.bit = N)');
    expect(normaliseDetail('rule loop at node-3 after 1000 fires')).toBe('rule loop at node-3 after N fires');
  });

  it('gives one text for two seeds that fail the same way', () => {
    const a = 'waits for a "ready" message from kiln; the inbox is empty; no ready is in flight to weir; one was lost: kiln sent it at 212 us about kiln~weir#3 (lost on the channel (loss 0.02))';
    const b = 'waits for a "ready" message from kiln; the inbox is empty; no ready is in flight to weir; one was lost: kiln sent it at 1.5 ms about kiln~weir#41 (lost on the channel (loss 0.02))';
    expect(normaliseDetail(a)).toBe(normaliseDetail(b));
  });
});

const entry = (rule: string, guard: number, reason: string): StallEntry => ({ rule, guard, kind: 'got', text: `got parity from weir as m`, reason });

describe('diagnoses', () => {
  it('name each node’s waiting rule and failing guard (from 1) for a stall, the same for equal stalls', () => {
    const one = diagnoseStall({ kiln: [entry('conclude', 2, 'waits for pair kiln~weir#1; this node does not hold it')], weir: [] });
    const two = diagnoseStall({ kiln: [entry('conclude', 2, 'waits for pair kiln~weir#8; this node does not hold it')], weir: [] });
    expect(one.signature).toBe('stall | kiln.conclude g3: waits for pair kiln~weir#*; this node does not hold it');
    expect(two).toEqual(one);
    expect(one.explanation).toContain('At kiln, rule "conclude" is stuck at guard 3 (got parity from weir as m)');
    expect(one.explanation).toContain('stand for the pair ids');
    // another guard is another bug
    expect(diagnoseStall({ kiln: [entry('conclude', 1, 'waits for pair kiln~weir#1; this node does not hold it')] }).signature).not.toBe(one.signature);
  });

  it('keep the failing expectations, not their values', () => {
    const d = diagnoseExpectations([
      { expr: 'delivered() >= 10', ok: false, value: false, saw: [{ expr: "delivered()", value: 7 }] },
      { expr: 'min_fidelity_delivered() > 0.9', ok: true, value: true, saw: [] },
      { expr: 'fired(kiln, "start") > 2', ok: false, value: false, saw: [] },
    ]);
    expect(d.signature).toBe('expect | delivered() >= 10 | fired(kiln, "start") > 2');
    expect(d.explanation).toBe('The run ends without a stall, but these expectations do not hold at its end: delivered() >= 10; fired(kiln, "start") > 2.');
  });

  it('name where a run-time error happened, without its seed-specific detail', () => {
    const a = diagnoseRunError('kiln.start', 'rule loop: fired more than 1000 times within one event (last: start, before it: start)');
    expect(a.signature).toBe('error | kiln.start: rule loop: fired more than N times within one event (last: start, before it: start)');
  });
});
