/**
 * End-to-end physics: whole networks run by the engine against the published formulas of
 * docs/physics.md. The engine only simulates (density matrices, sampled outcomes); the
 * formulas live here, as the independent check.
 */
import { describe, expect, it } from 'vitest';
import { runHeadless } from '../../src/session/run.js';
import { engineFrom, noiseWith, purificationNet, SWAP_NET } from './scenarios.js';

describe('two-site bit-flip purification', () => {
  // common practice (docs/physics.md, "Formulas the tests check"): p = F² + (1−F)², F′ = F²/p
  for (const F of [0.8, 0.7, 0.9, 0.63]) {
    it(`keeps pairs of fidelity F²/(F²+(1−F)²) for F = ${F}`, () => {
      const engine = engineFrom(purificationNet(), noiseWith(`{bit_flip: ${F}}`));
      const r = runHeadless(engine, { seed: 3, maxEvents: 4000 });
      const p = F * F + (1 - F) * (1 - F);
      expect(r.summary.delivered.length).toBeGreaterThan(10);
      for (const d of r.summary.delivered) expect(d.fidelity).toBeCloseTo((F * F) / p, 9);
    });
  }

  it('keeps a fraction F²+(1−F)² of the rounds, within 4σ', () => {
    const F = 0.8; // check value (docs/physics.md): p = 0.68
    const engine = engineFrom(purificationNet(), noiseWith(`{bit_flip: ${F}}`));
    const r = runHeadless(engine, { seed: 5, maxEvents: 40000 });
    const rounds = r.summary.fired.kiln.conclude;
    const kept = r.summary.delivered.length;
    const p = F * F + (1 - F) * (1 - F);
    const sigma = Math.sqrt((p * (1 - p)) / rounds);
    expect(rounds).toBeGreaterThan(1500);
    expect(Math.abs(kept / rounds - p)).toBeLessThan(4 * sigma);
  });
});

describe('BBPSSW on Werner pairs (Bennett et al., PRL 76, 722 (1996))', () => {
  // p = F² + 2F(1−F)/3 + 5(1−F)²/9, F′ = (F² + (1−F)²/9)/p; check values 0.75 → 0.788461538462
  for (const F of [0.75, 0.9]) {
    it(`gives F′ = (F² + (1−F)²/9)/p for F = ${F}`, () => {
      const engine = engineFrom(purificationNet(), noiseWith(`{werner: ${F}}`));
      const r = runHeadless(engine, { seed: 9, maxEvents: 3000 });
      const p = F * F + (2 * F * (1 - F)) / 3 + (5 * (1 - F) ** 2) / 9;
      const expected = (F * F + (1 - F) ** 2 / 9) / p;
      expect(r.summary.delivered.length).toBeGreaterThan(5);
      for (const d of r.summary.delivered) expect(d.fidelity).toBeCloseTo(expected, 9);
    });
  }
});

describe('DEJMPS with its rotations (Deutsch et al., PRL 77, 2818 (1996))', () => {
  /** The paper's map, in its order A=Φ+, B=Ψ−, C=Ψ+, D=Φ−; converted to ours [Φ+, Φ−, Ψ+, Ψ−]. */
  function dejmps([phiP, phiM, psiP, psiM]: number[]): { p: number; out: number[] } {
    const [A, B, C, D] = [phiP, psiM, psiP, phiM];
    const N = (A + B) ** 2 + (C + D) ** 2;
    const [A2, B2, C2, D2] = [(A * A + B * B) / N, (2 * C * D) / N, (C * C + D * D) / N, (2 * A * B) / N];
    return { p: N, out: [A2, D2, C2, B2] };
  }

  for (const input of [
    [0.7, 0.1, 0.15, 0.05], // check value (docs/physics.md): p = 0.625, out [0.788, 0.112, 0.052, 0.048]
    [0.6, 0.2, 0.05, 0.15],
    [0.85, 0.05, 0.06, 0.04],
  ]) {
    it(`maps Bell-diagonal ${JSON.stringify(input)} as the paper says`, () => {
      const engine = engineFrom(purificationNet({ dejmps: true }), noiseWith(`{bell_diagonal: [${input.join(', ')}]}`));
      const r = runHeadless(engine, { seed: 4, maxEvents: 6000 });
      const { p, out } = dejmps(input);
      expect(r.summary.delivered.length).toBeGreaterThan(10);
      for (const d of r.summary.delivered) d.bell.forEach((c, i) => expect(c).toBeCloseTo(out[i], 9));
      // the keep fraction is the paper's N, within 4σ
      const rounds = r.summary.fired.kiln.conclude;
      const sigma = Math.sqrt((p * (1 - p)) / rounds);
      expect(Math.abs(r.summary.delivered.length / rounds - p)).toBeLessThan(4 * sigma);
    });
  }
});

describe('entanglement swapping of Werner pairs (Dür, Briegel, Cirac, Zoller, PRA 59, 169 (1999))', () => {
  // F = F1·F2 + (1−F1)(1−F2)/3, with the correction table of Bennett et al., PRL 70, 1895 (1993)
  for (const [F1, F2] of [
    [0.9, 0.85],
    [0.97, 0.97],
    [0.8, 0.95],
  ]) {
    it(`joins ${F1} and ${F2} into F1·F2 + (1−F1)(1−F2)/3`, () => {
      const noise = `format: bellstep/noise@1
seed: 2
links:
  mill~quay: {pair: {werner: ${F1}}}
  mill~ridge: {pair: {werner: ${F2}}}
`;
      const r = runHeadless(engineFrom(SWAP_NET, noise), { seed: 2, maxEvents: 2000 });
      expect(r.summary.delivered.length).toBeGreaterThan(20);
      const expected = F1 * F2 + ((1 - F1) * (1 - F2)) / 3;
      for (const d of r.summary.delivered) {
        expect(d.ends).toEqual(['quay', 'ridge']);
        expect(d.fidelity).toBeCloseTo(expected, 9);
      }
    });
  }

  it('gives exactly Φ+ from perfect pairs, whatever the Bell-state measurement outcome', () => {
    const r = runHeadless(engineFrom(SWAP_NET), { seed: 1, maxEvents: 1000 });
    expect(r.summary.delivered.length).toBeGreaterThan(20);
    for (const d of r.summary.delivered) expect(d.fidelity).toBeCloseTo(1, 12);
  });
});

describe('memory decay', () => {
  const held = (t2: string, minAge: string, km: number) => `format: bellstep/program-set@1
title: hold then deliver
nodes:
  - {id: kiln, qubits: 1}
  - {id: weir, qubits: 1}
links:
  - {ends: [kiln, weir], length: ${km} km, slots: 1}
programs:
  kiln:
    rules:
      - name: hand-over
        when: [{have: {partner: weir, min_age: ${minAge}, as: p}}]
        do: [{deliver: p}]
  weir:
    rules:
      - name: hand-over
        when: [{have: {partner: kiln, min_age: ${minAge}, as: p}}]
        do: [{deliver: p}]
`;

  it('holds a perfect pair in T2 memories: F = (1 + e^(−2t/T2))/2 (Nielsen & Chuang §8.3)', () => {
    const noise = `format: bellstep/noise@1
seed: 1
defaults:
  memory: {t2: 1 s}
`;
    const km = 2;
    const r = runHeadless(engineFrom(held('1 s', '200 ms', km), noise), { seed: 1, maxEvents: 50 });
    const d = r.summary.delivered[0];
    // each half decays from emission: the herald takes half the link (common practice: 5 us/km)
    const t = 0.2 + (km / 2) * 5e-6;
    expect(d.fidelity).toBeCloseTo((1 + Math.exp((-2 * t) / 1)) / 2, 9);
    // check value (docs/physics.md) for t = 200 ms exactly is 0.835160023
    expect(d.fidelity).toBeCloseTo(0.835160023, 5);
  });

  it('wakes a node exactly when a pair reaches min_age', () => {
    const r = runHeadless(engineFrom(held('1 s', '3 ms', 2)), { seed: 1, maxEvents: 4 });
    const d = r.summary.delivered[0];
    // herald at 5 us (1 km of fiber to the midpoint), delivery 3 ms after it
    expect(d.time_ns).toBe(5_000 + 3_000_000);
  });
});

describe('classical messages', () => {
  it('take the shortest fiber path at 5 us per km (common practice: light in fiber ≈ 200,000 km/s)', () => {
    const net = `format: bellstep/program-set@1
title: relay
nodes:
  - {id: quay, qubits: 2}
  - {id: mill, qubits: 2}
  - {id: fen, qubits: 2}
  - {id: ridge, qubits: 2}
links:
  - {ends: [mill, quay], length: 10 km, slots: 1}
  - {ends: [fen, mill], length: 7 km, slots: 1}
  - {ends: [fen, ridge], length: 3 km, slots: 1}
  - {ends: [quay, ridge], length: 40 km, slots: 1}
programs:
  quay:
    rules:
      - name: ping
        when: [{have: {partner: mill, as: p}}]
        do:
          - send: {to: ridge, kind: hello, pair: p.id}
          - discard: p
  mill:
    rules:
      - name: drop
        when: [{have: {partner: quay, as: p}}]
        do: [{discard: p}]
`;
    const engine = engineFrom(net);
    let w = engine.initial(1);
    const sends: { sent: number; arrives: number }[] = [];
    const arrivals: number[] = [];
    for (let i = 0; i < 40; i++) {
      const { world, event } = engine.step(w);
      if (!event) break;
      w = world;
      sends.push(...event.sends);
      if (event.type === 'arrive') arrivals.push(event.time);
    }
    // via mill and fen: 10 + 7 + 3 = 20 km, shorter than the direct 40 km fiber
    expect(sends.length).toBeGreaterThan(2);
    for (const s of sends) expect(s.arrives - s.sent).toBe(20 * 5_000);
    expect(arrivals.length).toBeGreaterThan(1);
  });
});
