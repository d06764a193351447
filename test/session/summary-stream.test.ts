/**
 * The run summary written as a stream (delivery records read from the world one by one) has
 * exactly the bytes of the summary object printed with JSON.stringify: what `run --json`
 * writes must not depend on how it is written.
 */
import { describe, expect, it } from 'vitest';
import { runHeadless } from '../../src/session/run.js';
import { writeSummaryJson } from '../../src/session/summary.js';
import { DISAGREE_NET, engineFrom, noiseWith, purificationNet, SWAP_NET } from '../engine/scenarios.js';

function streamed(r: ReturnType<typeof runHeadless>): { text: string; chunks: number } {
  const parts: string[] = [];
  writeSummaryJson(r.head, r.world, (c) => parts.push(c));
  return { text: parts.join(''), chunks: parts.length };
}

describe('writeSummaryJson', () => {
  it('writes the same bytes as JSON.stringify of the summary, with many deliveries', () => {
    const r = runHeadless(engineFrom(purificationNet(), noiseWith('{werner: 0.9}', '', 5)), { seed: 5, maxEvents: 20000 });
    expect(r.summary.delivered.length).toBeGreaterThan(500);
    const { text, chunks } = streamed(r);
    expect(text).toBe(`${JSON.stringify(r.summary, null, 2)}\n`);
    // a long list goes out in more than one piece
    expect(chunks).toBeGreaterThan(1);
  });

  it('writes the same bytes with no delivery, and for a stalled run', () => {
    const none = runHeadless(engineFrom(SWAP_NET), { seed: 1, maxEvents: 1 });
    expect(none.summary.delivered).toHaveLength(0);
    expect(streamed(none).text).toBe(`${JSON.stringify(none.summary, null, 2)}\n`);
    const stalled = runHeadless(engineFrom(DISAGREE_NET), { seed: 3, maxEvents: 5000 });
    expect(stalled.summary.stall).not.toBeNull();
    expect(streamed(stalled).text).toBe(`${JSON.stringify(stalled.summary, null, 2)}\n`);
  });

  it('refuses a summary that already lists its records', () => {
    const r = runHeadless(engineFrom(purificationNet(), noiseWith('{werner: 0.9}', '', 5)), { seed: 5, maxEvents: 3000 });
    expect(() => writeSummaryJson(r.summary, r.world, () => undefined)).toThrow(/summary head/);
  });
});
