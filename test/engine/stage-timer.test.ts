/**
 * Stage timers: `min_wait` and `max_wait` count from the moment a pair entered its current
 * stage at this node (arrival counts as entering `link`), and `waited(pair)` reads the same
 * time. A wake-up is scheduled for the moment a timer changes its answer, so a pair moved to
 * a stage at T0 with `min_wait: 3ms` is acted on at exactly T0 + 3 ms.
 */
import { describe, expect, it } from 'vitest';
import type { Engine, EngineEvent, World } from '../../src/engine/index.js';
import { explainRule } from '../../src/engine/index.js';
import { formatDuration } from '../../src/model/units.js';
import { engineFrom, noiseWith } from './scenarios.js';

/** kiln parks each pair after a gate, then acts on it once it has waited in "held". */
const NET = (timer: string, act = '- discard: p') => `format: bellstep/program-set@1
nodes:
  - {id: kiln, qubits: 1}
  - {id: weir, qubits: 1}
links:
  - {ends: [kiln, weir], length: 2 km, slots: 1}
programs:
  kiln:
    rules:
      - name: park
        when: [{have: {partner: weir, as: p}}]
        do:
          - gate: {op: h, on: p}
          - stage: {pair: p, to: held}
      - name: act
        when: [{have: {partner: weir, stage: held, ${timer}, as: p}}]
        do:
          - log: "waited {waited(p)} ns, age {age(p)} ns"
          ${act}
`;

/** Gates take 40 us, so the stage step runs 40 us after the event that fired park. */
const NOISE = noiseWith('{werner: 0.9}', '    success: 0.5\n  gates:\n    single: {duration: 40 us}');

function runUntil(engine: Engine, stop: (ev: EngineEvent) => boolean, max = 10_000): { events: EngineEvent[]; world: World } {
  let world = engine.initial();
  const events: EngineEvent[] = [];
  for (let i = 0; i < max; i++) {
    const r = engine.step(world);
    if (!r.event) break;
    world = r.world;
    events.push(r.event);
    if (stop(r.event)) break;
  }
  return { events, world };
}

const fired = (ev: EngineEvent, rule: string) => ev.fires.some((f) => f.node === 'kiln' && f.rule === rule);

describe('stage timers', () => {
  it('acts on a pair moved to a stage at T0 with min_wait 3 ms at exactly T0 + 3 ms, on a wake-up of its own', () => {
    const { events } = runUntil(engineFrom(NET('min_wait: 3ms'), NOISE), (ev) => fired(ev, 'act'));
    const park = events.find((ev) => fired(ev, 'park'))!;
    const act = events[events.length - 1];
    expect(fired(act, 'act')).toBe(true);
    const t0 = park.time + 40_000;
    expect(act.time).toBe(t0 + 3_000_000);
    expect(act.type).toBe('wake');
    expect(act.summary).toContain('woke (stage timer)');
    // nothing acted on it before
    expect(events.filter((ev) => fired(ev, 'act'))).toHaveLength(1);
    const fire = act.fires.find((f) => f.rule === 'act')!;
    expect(fire.log[0]).toBe(`waited 3000000 ns, age ${act.time - park.time} ns`);
  });

  it('counts from the stage step, not from the arrival, unlike min_age', () => {
    const wait = runUntil(engineFrom(NET('min_wait: 3ms'), NOISE), (ev) => fired(ev, 'act')).events;
    const age = runUntil(engineFrom(NET('min_age: 3ms'), NOISE), (ev) => fired(ev, 'act')).events;
    const park = wait.find((ev) => fired(ev, 'park'))!;
    // the pair arrived at park's event; min_age counts 3 ms from there, 40 us earlier
    expect(age[age.length - 1].time).toBe(park.time + 3_000_000);
    expect(wait[wait.length - 1].time).toBe(park.time + 40_000 + 3_000_000);
  });

  it('with max_wait, takes a pair only while it is fresh in its stage', () => {
    // weir tells kiln about each pair; a fault delays the word, and kiln's "fresh" rule
    // takes the pair only if it has waited in "held" at most 1 ms, else "late" does
    const net = `format: bellstep/program-set@1
nodes:
  - {id: kiln, qubits: 1}
  - {id: weir, qubits: 1}
links:
  - {ends: [kiln, weir], length: 2 km, slots: 1}
programs:
  kiln:
    rules:
      - name: park
        when: [{have: {partner: weir, as: p}}]
        do: [{stage: {pair: p, to: held}}]
      - name: fresh
        when:
          - got: {from: weir, kind: go, as: m}
          - have: {partner: weir, stage: held, max_wait: 1ms, as: p}
        do: [{discard: p}]
      - name: late
        when:
          - got: {from: weir, kind: go, as: m}
          - have: {partner: weir, stage: held, as: p}
        do: [{discard: p}]
  weir:
    rules:
      - name: tell
        when: [{have: {partner: kiln, as: q}}]
        do:
          - send: {to: kiln, kind: go, pair: q.id}
          - discard: q
`;
    const noise = (by: string) => `${noiseWith('{werner: 0.9}', '    success: 0.5')}\nfaults:\n  - delay: {from: weir, to: kiln, kind: go, by: ${by}}\n`;
    const first = (by: string) => runUntil(engineFrom(net, noise(by)), (ev) => fired(ev, 'fresh') || fired(ev, 'late')).events.at(-1)!;
    expect(first('500 us').fires.map((f) => f.rule)).toEqual(['fresh']);
    expect(first('2 ms').fires.map((f) => f.rule)).toEqual(['late']);
  });

  it('reads waited() of a pair the body already discarded, as age() does, instead of failing', () => {
    const net = NET('min_wait: 3ms', '- discard: p\n          - log: "after: {waited(p)} ns"');
    const { events } = runUntil(engineFrom(net, NOISE), (ev) => fired(ev, 'act'));
    const log = events.at(-1)!.fires.find((f) => f.rule === 'act')!.log;
    expect(log).toEqual(['waited 3000000 ns, age ' + (events.at(-1)!.time - events.find((ev) => fired(ev, 'park'))!.time) + ' ns', 'after: 3000000 ns']);
  });

  it('explains a pair that has not waited long enough, with the time it is due', () => {
    const engine = engineFrom(NET('min_wait: 3ms'), NOISE);
    const { events, world } = runUntil(engine, (ev) => fired(ev, 'park'));
    const park = events[events.length - 1];
    const rule = engine.net.rules.get('kiln')!.find((r) => r.name === 'act')!;
    const t0 = park.time + 40_000;
    const ms = formatDuration;
    // right after park fired, the stage step lies 40 us ahead, at the node's local time
    const before = explainRule(engine.net, world, 'kiln', rule);
    expect(before.ready).toBe(false);
    expect(before.guards[0].text).toBe('have partner weir, stage held, min_wait 3 ms as p');
    expect(before.guards[0].reason).toMatch(new RegExp(`#\\d+ enters stage "held" at ${ms(t0)}, once the node's operations are done, less than min_wait 3 ms \\(due at ${ms(t0 + 3_000_000)}\\)`));
    // once the node is free (its own wake-up at t0), the pair has waited 0 ns
    const next = engine.step(world);
    expect(next.event!.time).toBe(t0);
    const after = explainRule(engine.net, next.world, 'kiln', rule);
    expect(after.guards[0].reason).toContain(`entered stage "held" 0 ns ago, less than min_wait 3 ms (due at ${ms(t0 + 3_000_000)})`);
  });
});
