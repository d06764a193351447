/** The Session: stepping, rewind, jumps, breakpoints, watches and explanations. */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { deliveredCount, recentDeliveries, type Engine, type World } from '../../src/engine/index.js';
import { Session } from '../../src/session/session.js';
import { InputError } from '../../src/model/errors.js';
import { DISAGREE_NET, engineFrom, noiseWith, purificationNet, SWAP_NET } from '../engine/scenarios.js';

/** Every field of a world, with density matrices as their exact bytes. */
function bits(w: World): string {
  return JSON.stringify(w, (_k, v) => (v instanceof Float64Array ? Buffer.from(v.buffer, v.byteOffset, v.byteLength).toString('hex') : v instanceof Map ? [...v.entries()] : v));
}

/** Worlds 0..n by plain stepping, the reference the session must reproduce exactly. */
function reference(engine: Engine, seed: number, n: number): string[] {
  const out: string[] = [];
  let w = engine.initial(seed);
  out.push(bits(w));
  for (let i = 0; i < n; i++) {
    const r = engine.step(w);
    if (!r.event) break;
    w = r.world;
    out.push(bits(w));
  }
  return out;
}

const NOISY = (seed: number, f: number) => `format: bellstep/noise@1
seed: ${seed}
defaults:
  link: {pair: {werner: ${f}}, success: 0.3}
  memory: {t2: 200 ms}
  gates:
    two: {depolarizing: 0.01, duration: 30 us}
    measure: {flip: 0.02, duration: 5 us}
`;

describe('rewind', () => {
  it('gives bit-identical worlds after any mix of steps, rewinds and jumps (property)', () => {
    const op = fc.oneof(
      fc.record({ kind: fc.constant('fwd' as const), n: fc.integer({ min: 1, max: 15 }) }),
      fc.record({ kind: fc.constant('back' as const), n: fc.integer({ min: 1, max: 40 }) }),
      fc.record({ kind: fc.constant('goto' as const), n: fc.integer({ min: 0, max: 260 }) }),
    );
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1000 }), fc.double({ min: 0.7, max: 0.99, noNaN: true }), fc.boolean(), fc.array(op, { minLength: 1, maxLength: 10 }), (seed, f, swap, ops) => {
        const net = swap ? SWAP_NET : purificationNet();
        const engine = engineFrom(net, NOISY(seed, f));
        // enough reference worlds for the longest walk: 10 ops of at most 15 steps after a jump to 260
        const ref = reference(engine, seed, 430);
        // a tiny window, keyframe interval and budget, so that every path (window, keyframes, thinning, rebuilds) is taken
        const s = new Session(engine, { seed, window: 8, keyframeInterval: 16, budgetBytes: 60_000 });
        for (const o of ops) {
          if (o.kind === 'fwd') for (let i = 0; i < o.n; i++) s.stepForward();
          else if (o.kind === 'back') for (let i = 0; i < o.n; i++) s.stepBack();
          else s.goto(Math.min(o.n, ref.length - 1));
          expect(bits(s.world())).toBe(ref[s.cursor]);
        }
        // and forward again after the rewinds, one event at a time
        for (let i = 0; i < 10 && s.cursor < ref.length - 1; i++) {
          s.stepForward();
          expect(bits(s.world())).toBe(ref[s.cursor]);
        }
      }),
      { numRuns: 25 },
    );
  });

  it('goes to an event across keyframes and back, and to a simulated time', () => {
    const engine = engineFrom(SWAP_NET, NOISY(4, 0.95));
    const ref = reference(engine, 4, 600);
    const s = new Session(engine, { seed: 4, window: 16, keyframeInterval: 32 });
    s.goto(590);
    expect(s.cursor).toBe(590);
    expect(bits(s.world())).toBe(ref[590]);
    s.goto(37);
    expect(bits(s.world())).toBe(ref[37]);
    s.stepBack();
    expect(bits(s.world())).toBe(ref[36]);
    expect(s.event()?.index).toBe(35);
    const t = s.history.timeOf(300);
    s.gotoTime(t);
    expect(s.world().time).toBeLessThanOrEqual(t);
    expect(s.history.timeOf(s.cursor)).toBeGreaterThan(t);
  });

  it('lands on a held keyframe without re-simulating, and still shows the event that led there', () => {
    const engine = engineFrom(SWAP_NET, NOISY(4, 0.95));
    const ref = reference(engine, 4, 300);
    const s = new Session(engine, { seed: 4, window: 16, keyframeInterval: 32 });
    s.goto(290);
    expect(s.history.keyframe(128)).toBeDefined();
    let stepped = 0;
    const advance = engine.advance.bind(engine);
    engine.advance = (...args: Parameters<Engine['advance']>) => {
      stepped += args[1];
      return advance(...args);
    };
    s.goto(128);
    expect(stepped).toBe(0);
    expect(bits(s.world())).toBe(ref[128]);
    // the event pane's line is recomputed when asked, and is the 128th event (#127)
    expect(s.event()?.index).toBe(127);
    engine.advance = advance;
  });

  it('keeps the whole history within its budget on a long run, keyframes dense near the cursor and sparse far back', () => {
    const budget = 2_000_000;
    const s = new Session(engineFrom(SWAP_NET), { window: 32, keyframeInterval: 8, budgetBytes: budget });
    s.goto(20_000);
    expect(s.cursor).toBe(20_000);
    expect(s.history.bytes).toBeLessThanOrEqual(budget);
    const kf = s.history.keyframesBelow(20_001, 1e9).sort((a, b) => a - b);
    const gaps = (lo: number, hi: number) => {
      const ks = kf.filter((k) => k >= lo && k <= hi);
      return ks.length < 2 ? Infinity : (ks[ks.length - 1] - ks[0]) / (ks.length - 1);
    };
    // thinned: fewer than one every 8 events over the run, and sparser far back than near the cursor
    expect(kf.length).toBeLessThan(20_000 / 8);
    expect(gaps(0, 5000)).toBeGreaterThan(gaps(15_000, 20_000));
    // and any world is still exact: one far back, re-simulated from the nearest keyframe
    const ref = reference(engineFrom(SWAP_NET), 1, 3001);
    s.goto(3000);
    expect(bits(s.world())).toBe(ref[3000]);
  });

  it('reports the start and the end of the run', () => {
    const s = new Session(engineFrom(DISAGREE_NET));
    expect(s.stepBack()).toBe(false);
    expect(s.stop.reason).toBe('start');
    while (s.stepForward());
    expect(s.stop.reason).toBe('stall');
    expect(s.ending()).toBe('stall');
  });
});

describe('breakpoints', () => {
  it('continues to the next hit and reverse-continues to the previous one', () => {
    const s = new Session(engineFrom(SWAP_NET), { window: 8, keyframeInterval: 16 });
    s.addBreakpoint('on fire mill.swap');
    const hits: number[] = [];
    for (let i = 0; i < 5; i++) {
      expect(s.continue().reason).toBe('breakpoint');
      hits.push(s.cursor);
      expect(s.event()!.fires.some((f) => f.node === 'mill' && f.rule === 'swap')).toBe(true);
    }
    expect(new Set(hits).size).toBe(5);
    // back through every hit in reverse order, then to the start
    for (let i = 3; i >= 0; i--) {
      expect(s.reverseContinue().reason).toBe('breakpoint');
      expect(s.cursor).toBe(hits[i]);
    }
    expect(s.reverseContinue().reason).toBe('start');
    expect(s.cursor).toBe(0);
    expect(s.breakpoints()[0].hits).toBe(5);
  });

  it('hits a condition when it becomes true, for some pair when it names one', () => {
    const s = new Session(engineFrom(purificationNet(), noiseWith('{werner: 0.8}', '', 3)), { continueLimit: 20_000 });
    s.addBreakpoint('delivered() >= 2');
    s.continue();
    expect(deliveredCount(s.world())).toBe(2);
    // held pairs decay from emission, so a fresh F = 0.9 pair is already just below 0.9 at its herald
    const s2 = new Session(engineFrom(SWAP_NET, NOISY(2, 0.9)), { continueLimit: 20_000 });
    s2.addBreakpoint('fidelity(p) < 0.9');
    const stop = s2.continue();
    expect(stop.reason).toBe('breakpoint');
    expect(stop.detail).toMatch(/fidelity\(p\) < 0.9 \(p = mill~(quay|ridge)#1\)/);
    expect(s2.cursor).toBe(1);
  });

  it('can be disabled, enabled and removed', () => {
    const s = new Session(engineFrom(SWAP_NET), { continueLimit: 2000 });
    const bp = s.addBreakpoint('on send swapped');
    s.enableBreakpoint(bp.id, false);
    const stop = s.continue();
    expect(stop.reason).toBe('limit');
    expect(s.cursor).toBe(2000);
    s.goto(0);
    s.enableBreakpoint(bp.id, true);
    expect(s.continue().reason).toBe('breakpoint');
    expect(s.removeBreakpoint(bp.id)).toBe(true);
    expect(s.breakpoints()).toHaveLength(0);
  });

  it('stops on a stall with "on stall"', () => {
    const s = new Session(engineFrom(DISAGREE_NET));
    const bp = s.addBreakpoint('on stall');
    const stop = s.continue();
    expect(stop.reason).toBe('stall');
    expect(stop.breakpoint).toBe(bp.id);
  });

  it('refuses a breakpoint that cannot be evaluated, with a clear error', () => {
    const s = new Session(engineFrom(SWAP_NET));
    expect(() => s.addBreakpoint('fidelity("mill~quay#999") < 0.9')).toThrow(/no pair "mill~quay#999"/);
    expect(() => s.addBreakpoint('pairs(mil) > 1')).toThrow(/unknown node "mil" \(did you mean "mill"\?\)/);
    expect(() => s.addBreakpoint('on fire quay.swap')).toThrow(/quay has no rule "swap"/);
    expect(() => s.addBreakpoint('on send swaped')).toThrow(/did you mean "swapped"/);
    expect(() => s.addBreakpoint('delivered() +')).toThrow(InputError);
  });
});

describe('watches and explanations', () => {
  it('shows a watch value and when it last changed', () => {
    const s = new Session(engineFrom(SWAP_NET));
    s.addWatch('delivered()');
    for (let i = 0; i < 30; i++) s.stepForward();
    const [w] = s.watches();
    expect(Number(w.value)).toBe(deliveredCount(s.world()));
    const last = recentDeliveries(s.world()).next().value!;
    // the change happened at the event that completed the last delivery
    expect(s.history.timeOf(w.changedAt!)).toBe(last.time_ns);
  });

  it('finds when a watch last changed even after a jump, through keyframes', () => {
    const engine = engineFrom(SWAP_NET, NOISY(6, 0.95));
    // the reference: step one event at a time and note the last event that changed the count
    let w = engine.initial(6);
    let lastChange = -1;
    for (let i = 0; i < 3000; i++) {
      const before = deliveredCount(w);
      w = engine.step(w).world;
      if (deliveredCount(w) !== before) lastChange = i;
    }
    const s = new Session(engine, { seed: 6, window: 16, keyframeInterval: 32 });
    s.addWatch('delivered()');
    s.goto(3000);
    const [watch] = s.watches();
    expect(Number(watch.value)).toBe(deliveredCount(w));
    expect(watch.changedAt).toBe(lastChange);
  });

  it('explains why each rule is not firing, guard by guard', () => {
    const s = new Session(engineFrom(DISAGREE_NET));
    s.continue();
    const rules = s.explain('weir');
    const conclude = rules.find((r) => r.rule === 'conclude')!;
    expect(conclude.ready).toBe(false);
    expect(conclude.guards.map((g) => g.state)).toEqual(['holds', 'holds', 'fails']);
    expect(conclude.guards[2].reason).toContain('waits for a "parity" message from kiln about pair kiln~weir#2');
  });

  it('adds what static analysis knows: a kind that nobody sends', () => {
    const net = SWAP_NET.replace('kind: swapped, as: m}\n          - have: {id: m.pair, as: p}\n        do:\n          - rebind', 'kind: swaped, as: m}\n          - have: {id: m.pair, as: p}\n        do:\n          - rebind');
    const s = new Session(engineFrom(net));
    for (let i = 0; i < 10; i++) s.stepForward();
    const relabel = s.explain('quay').find((r) => r.rule === 'relabel')!;
    expect(relabel.summary).toContain('waits for a "swaped" message from mill');
    expect(relabel.lint.join(' ')).toMatch(/swaped/);
  });
});
