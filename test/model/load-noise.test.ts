import { describe, it, expect } from 'vitest';
import { FIBER_SPEED_M_PER_S, idealNoise, linkNoiseFor, loadNoiseModel, nodeNoiseFor } from '../../src/model/load-noise.js';
import { fixture, inputErrors, where } from './helpers.js';

const FILE = 'swap.noise.yaml';
const text = fixture(FILE);

describe('idealNoise', () => {
  it('is perfect Φ+ pairs on every attempt with no decay, no gate or readout error and zero durations', () => {
    const n = idealNoise();
    expect(n.seed).toBe(1);
    expect(idealNoise(42).seed).toBe(42);
    expect(n.file).toBe('');
    expect(n.defaults.link).toEqual({ pair: { kind: 'werner', f: 1 }, success: { kind: 'fixed', p: 1 }, attemptPeriod: 'fiber' });
    expect(n.defaults.memory).toEqual({});
    expect(n.defaults.gates).toEqual({
      single: { depolarizing: 0, durationNs: 0 },
      two: { depolarizing: 0, durationNs: 0 },
      measure: { flip: 0, durationNs: 0 },
    });
    // light in fiber travels about 200,000 km/s (common practice)
    expect(n.defaults.classical).toEqual({ speedMPerS: 200_000 * 1000, loss: 0, extraDelayNs: 0 });
    expect(FIBER_SPEED_M_PER_S).toBe(2e8);
    expect([n.links, n.nodes, n.faults]).toEqual([{}, {}, []]);
  });
});

describe('loadNoiseModel on the swap fixture', () => {
  const n = loadNoiseModel(FILE, text);

  it('reads the seed and the defaults, with units converted', () => {
    expect(n.seed).toBe(20261201);
    expect(n.defaults.link.pair).toEqual({ kind: 'werner', f: 0.95 });
    expect(n.defaults.link.success).toEqual({ kind: 'derived', scheme: 'double-click', fiberLossDbPerKm: 0.2, detectorEfficiency: 0.9 });
    expect(n.defaults.memory).toEqual({ t1Ns: 10 * 1e9, t2Ns: 1e9 });
    expect(n.defaults.gates.two).toEqual({ depolarizing: 0.005, durationNs: 100 * 1e3 });
    expect(n.defaults.gates.measure).toEqual({ flip: 0.01, durationNs: 10 * 1e3 });
    expect(n.defaults.classical).toEqual({ speedMPerS: 2e8, loss: 0, extraDelayNs: 0 });
  });

  it('merges a per-link entry over defaults.link, key by key', () => {
    const l = n.links['mill~ridge'];
    expect(l.pair).toEqual({ kind: 'bell_diagonal', coeffs: [0.92, 0.04, 0.03, 0.01] });
    expect(l.success).toEqual({ kind: 'fixed', p: 0.02 });
    // not given for the link, so the default applies
    expect(l.attemptPeriod).toBe('fiber');
    expect(linkNoiseFor(n, 'mill~ridge')).toBe(l);
    expect(linkNoiseFor(n, 'mill~quay')).toBe(n.defaults.link);
  });

  it('merges a per-node entry over the defaults, field by field', () => {
    const mill = n.nodes.mill;
    expect(mill.memory).toEqual({ t1Ns: 10 * 1e9, t2Ns: 500 * 1e6 });
    expect(mill.gates.two).toEqual({ depolarizing: 0.01, durationNs: 100 * 1e3 });
    expect(mill.gates.single).toEqual(n.defaults.gates.single);
    expect(nodeNoiseFor(n, 'quay')).toEqual({ memory: n.defaults.memory, gates: n.defaults.gates });
    expect(nodeNoiseFor(n, 'mill')).toBe(mill);
  });

  it('reads faults with their positions', () => {
    expect(n.faults).toEqual([{ kind: 'delay', from: 'mill', to: 'ridge', msgKind: 'bits', byNs: 5 * 1e6, pos: { file: FILE, ...where(text, 'delay: {from') } }]);
  });
});

const noise = (body: string) => `format: bellstep/noise@1\nseed: 3\n${body}`;

describe('loadNoiseModel details', () => {
  it('is as small as format and seed, everything else ideal', () => {
    const n = loadNoiseModel('n.yaml', noise(''));
    const ideal = idealNoise(3);
    expect(n.defaults).toEqual(ideal.defaults);
  });

  it('reads single-click success with its bright state, an attempt period and a drop fault', () => {
    const n = loadNoiseModel(
      'n.yaml',
      noise(`defaults:
  link:
    pair: {bit_flip: 0.9}
    success: {scheme: single-click, fiber_loss: 0.25 dB/km, detector_efficiency: 0.8, bright_state: 0.05}
    attempt_period: 20 us
faults:
  - drop: {kind: parity, nth: 2}
`),
    );
    expect(n.defaults.link).toEqual({
      pair: { kind: 'bit_flip', f: 0.9 },
      success: { kind: 'derived', scheme: 'single-click', fiberLossDbPerKm: 0.25, detectorEfficiency: 0.8, brightState: 0.05 },
      attemptPeriod: 20_000,
    });
    expect(n.faults[0]).toMatchObject({ kind: 'drop', msgKind: 'parity', nth: 2 });
    expect(n.faults[0]).not.toHaveProperty('from');
  });

  it('checks T2 <= 2·T1 after merging a node over the defaults', () => {
    const t = noise(`defaults:
  memory: {t1: 100 ms}
nodes:
  mill:
    memory: {t2: 300 ms}
`);
    const errs = inputErrors(() => loadNoiseModel('n.yaml', t));
    expect(errs).toHaveLength(1);
    expect(errs[0].message).toContain('T2 cannot exceed 2·T1');
    expect(errs[0].field).toBe('nodes.mill.memory.t2');
    expect([errs[0].line, errs[0].col]).toEqual([where(t, '300 ms').line, where(t, '300 ms').col]);
    // exactly 2·T1 is allowed
    expect(() => loadNoiseModel('n.yaml', t.replace('300 ms', '200 ms'))).not.toThrow();
  });

  it('accepts Bell coefficients that sum to 1 within 1e-9 and refuses a larger gap', () => {
    const ok = noise('defaults:\n  link: {pair: {bell_diagonal: [0.7, 0.1, 0.15, 0.0500000000001]}}\n');
    expect(() => loadNoiseModel('n.yaml', ok)).not.toThrow();
    const bad = noise('defaults:\n  link: {pair: {bell_diagonal: [0.7, 0.1, 0.15, 0.06]}}\n');
    expect(inputErrors(() => loadNoiseModel('n.yaml', bad))[0].message).toContain('must sum to 1');
  });
});
