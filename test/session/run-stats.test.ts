/**
 * Run statistics (`stats` in `run --json`): a worked example of the figures, agreement with
 * the summary's own counts, latency from the earliest link pair behind each delivered pair,
 * and the share of time a link's slots were full, checked against the events themselves.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { deliveries, Engine } from '../../src/engine/index.js';
import { loadInputs } from '../../src/model/index.js';
import { runHeadless } from '../../src/session/run.js';
import { runStats, statsFrom } from '../../src/session/run-stats.js';
import type { RunSummary } from '../../src/api/run.js';
import { runCli } from '../helpers/run-cli.js';

function demoFiles(dir: string, net: string, noise: string): { net: string; noise: string; files: Record<string, string> } {
  const n = `demos/${dir}/${net}`;
  const z = `demos/${dir}/${noise}`;
  return { net: n, noise: z, files: { [n]: readFileSync(n, 'utf8'), [z]: readFileSync(z, 'utf8') } };
}

describe('run statistics, a worked example', () => {
  // Five pairs delivered in 2 ms of simulated time:
  //   fidelities 0.91 0.85 0.97 0.88 0.93, sorted 0.85 0.88 0.91 0.93 0.97;
  //   nearest rank ⌈p·n/100⌉ with n = 5: p5 → rank 1 = 0.85, p50 → rank 3 = 0.91, p95 → rank 5 = 0.97;
  //   mean (0.91 + 0.85 + 0.97 + 0.88 + 0.93) / 5 = 0.908; rate 5 / 0.002 s = 2500 per second.
  //   latencies (time − born) 300, 100, 500, 200, 400 µs: mean 300 µs, p50 rank 3 = 300 µs, p95 rank 5 = 500 µs.
  //   link a~b made 40 pairs and was full 0.5 ms of 2 ms: 20000 per second, share 0.25.
  const input = {
    timeNs: 2_000_000,
    fidelities: [0.91, 0.85, 0.97, 0.88, 0.93],
    latencies: [300_000, 100_000, 500_000, 200_000, 400_000],
    links: [{ id: 'a~b', generated: 40, fullNs: 500_000 }],
  };

  it('gives the figures computed by hand', () => {
    const s = statsFrom(input);
    expect(s.delivered_per_second).toBe(2500);
    expect(s.fidelity.mean).toBeCloseTo(0.908, 12);
    expect(s.fidelity).toMatchObject({ min: 0.85, p5: 0.85, p50: 0.91, p95: 0.97 });
    expect(s.latency_ns).toEqual({ mean: 300_000, p50: 300_000, p95: 500_000, max: 500_000 });
    expect(s.links).toEqual({ 'a~b': { generated_per_second: 20_000, slots_full_share: 0.25 } });
    expect(Object.keys(s)).toEqual(['delivered_per_second', 'fidelity', 'latency_ns', 'links']);
  });

  it('is null where nothing qualifies', () => {
    const s = statsFrom({ timeNs: 0, fidelities: [], latencies: [], links: [{ id: 'a~b', generated: 0, fullNs: 0 }] });
    expect(s).toEqual({
      delivered_per_second: null,
      fidelity: { mean: null, min: null, p5: null, p50: null, p95: null },
      latency_ns: { mean: null, p50: null, p95: null, max: null },
      links: { 'a~b': { generated_per_second: null, slots_full_share: null } },
    });
  });
});

describe('run statistics of a run', () => {
  it('agree with the summary’s delivered, generated and time_ns, and come after its keys', async () => {
    const d = demoFiles('nested-repeater', 'repeater.net.yaml', 'repeater.noise.yaml');
    const r = await runCli(['run', d.net, '--noise', d.noise, '--until', '60ms', '--json'], d.files);
    const s = JSON.parse(r.stdout) as RunSummary;
    expect(Object.keys(s)).toEqual(['format', 'seed', 'events', 'time_ns', 'stop', 'delivered', 'fired', 'messages', 'generated', 'expectations', 'stall', 'stats']);
    const seconds = s.time_ns / 1e9;
    expect(s.delivered.length).toBeGreaterThan(10);
    expect(s.stats.delivered_per_second! * seconds).toBeCloseTo(s.delivered.length, 9);
    expect(Object.keys(s.stats.links)).toEqual(Object.keys(s.generated));
    for (const [id, n] of Object.entries(s.generated)) expect(s.stats.links[id].generated_per_second! * seconds).toBeCloseTo(n, 9);
    const fid = s.delivered.map((p) => p.fidelity);
    expect(s.stats.fidelity.min).toBe(Math.min(...fid));
    expect(s.stats.fidelity.mean).toBeCloseTo(fid.reduce((a, b) => a + b, 0) / fid.length, 12);
    expect(s.stats.latency_ns.max).toBeLessThanOrEqual(s.time_ns);
    // the text report shows them in a short table
    const text = await runCli(['run', d.net, '--noise', d.noise, '--until', '60ms'], d.files);
    expect(text.stdout).toContain(`run statistics: ${Number(s.stats.delivered_per_second!.toFixed(2))} pairs delivered per second`);
    expect(text.stdout).toMatch(/alder~birch\s+[0-9.]+\s+[0-9.]+ %/);
  });

  it('measure latency from the earliest link pair that a swapped pair was made of', () => {
    const d = demoFiles('three-site-swap', 'swap.net.yaml', 'swap.noise.yaml');
    const { programSet, noise } = loadInputs({ netFile: d.net, netText: d.files[d.net], noiseFile: d.noise, noiseText: d.files[d.noise] });
    const heralded = new Map<number, number>();
    const r = runHeadless(new Engine(programSet, noise), {
      seed: noise.seed,
      untilNs: 20_000_000,
      onEvent: (ev) => {
        if (ev.type === 'herald') heralded.set(Number(ev.pair!.split('#')[1]), ev.time);
      },
    });
    const records = deliveries(r.world);
    expect(records.length).toBeGreaterThan(5);
    for (const rec of records) {
      // a joined id names the serials of the link pairs it was made of, e.g. quay~ridge#5+3
      const serials = rec.id.split('#')[1].split('+').map(Number);
      expect(serials).toHaveLength(2);
      expect(rec.born_ns).toBe(Math.min(...serials.map((n) => heralded.get(n)!)));
    }
    // a swapped pair is delivered after both of its link pairs were made
    for (const rec of records) expect(rec.time_ns).toBeGreaterThan(rec.born_ns);
  });

  it('count the time a link could not attempt because its slots were full, as the events show it', () => {
    // one slot per end, and both ends drop a pair 1 ms after it arrives: the link is full from
    // each herald until the second of the two discards
    const net = `format: bellstep/program-set@1
title: hold a pair for a millisecond, then let it go
nodes:
  - {id: kiln, qubits: 1}
  - {id: weir, qubits: 1}
links:
  - {ends: [kiln, weir], length: 2 km, slots: 1}
programs:
  kiln:
    rules:
      - {name: drop, when: [{have: {partner: weir, min_age: 1 ms, as: p}}], do: [{discard: p}]}
  weir:
    rules:
      - {name: drop, when: [{have: {partner: kiln, min_age: 1 ms, as: p}}], do: [{discard: p}]}
`;
    const noiseText = 'format: bellstep/noise@1\nseed: 12\ndefaults:\n  link: {pair: {werner: 0.9}, success: 0.002}\n';
    const { programSet, noise } = loadInputs({ netFile: 'hold.net.yaml', netText: net, noiseFile: 'hold.noise.yaml', noiseText });
    const engine = new Engine(programSet, noise);
    let full = 0;
    let since = -1;
    const open = new Set<string>();
    const r = runHeadless(engine, {
      seed: 12,
      untilNs: 50_000_000,
      onEvent: (ev) => {
        if (ev.type === 'herald') {
          since = ev.time;
          open.add(`kiln ${ev.pair}`).add(`weir ${ev.pair}`);
        }
        for (const x of ev.discards) {
          open.delete(`${x.node} ${x.pair}`);
          if (open.size === 0 && since >= 0) {
            full += ev.time - since;
            since = -1;
          }
        }
      },
    });
    if (since >= 0) full += r.world.time - since;
    const stats = runStats(engine.net, r.world);
    expect(r.summary.generated['kiln~weir']).toBeGreaterThan(3);
    expect(full).toBeGreaterThan(0);
    expect(stats.links['kiln~weir'].slots_full_share).toBeCloseTo(full / r.world.time, 12);
  });
});
