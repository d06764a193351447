/**
 * Each bundled demo does what its README says, through the real CLI: `check` finds nothing,
 * and `run` delivers (or stalls) with the figures the published formulas predict.
 */
import { describe, expect, it } from 'vitest';
import { parseDocument } from 'yaml';
import { parseDuration } from '../../src/model/units.js';
import { parseReplay } from '../../src/session/replay.js';
import { engineFromReplay } from '../../src/session/verify.js';
import { bbpssw, dejmps, swapBell, swapWerner, werner } from './bell-formulas.js';
import { cliOn, idealNoise, loadDemo, meanFidelity, noiseNumber, runJson, withoutRules, withPick } from './demo-files.js';

const RUN = ['--until', '200ms'];

describe.each(['three-site-swap', 'two-site-purification', 'stalled-purification', 'lost-message', 'nested-repeater', 'long-chain'])('%s', (name) => {
  it('passes check with no findings', async () => {
    const r = await cliOn(loadDemo(name), 'check');
    expect(r.stderr).toBe('');
    expect(r.stdout).toContain('no findings');
    expect(r.code).toBe(0);
  });
});

/** Every event of a replay with its one-line text, rebuilt by re-running its embedded inputs (as the file keeps only the last ones' text). */
function replayLines(text: string): { time_ns: number; summary: string }[] {
  const r = parseReplay(text);
  const engine = engineFromReplay(r);
  const out: { time_ns: number; summary: string }[] = [];
  engine.advance(engine.initial(r.seed), r.events.length, { after: (ev) => (out.push({ time_ns: ev.time, summary: ev.summary }), false) }, { keep: 'none', detail: false });
  expect(out.length).toBe(r.events.length);
  return out;
}

describe('three-site-swap', () => {
  const demo = loadDemo('three-site-swap');
  const f = noiseNumber(demo.noise, ['defaults', 'link', 'pair', 'werner']);

  it('delivers quay~ridge pairs of the Werner swap fidelity when gates and memories are ideal', async () => {
    const { code, s } = await runJson(demo, RUN, { noise: idealNoise(demo.noise) });
    expect(code).toBe(0);
    expect(s.delivered.length).toBeGreaterThan(100);
    for (const d of s.delivered) {
      expect(d.ends).toEqual(['quay', 'ridge']);
      // Dür, Briegel, Cirac, Zoller 1999: F1·F2 + (1−F1)(1−F2)/3
      expect(d.fidelity).toBeCloseTo(swapWerner(f, f), 9);
    }
  });

  it('delivers a little below that with the demo noise', async () => {
    const { code, s } = await runJson(demo, RUN);
    expect(code).toBe(0);
    const p2 = noiseNumber(demo.noise, ['defaults', 'gates', 'two', 'depolarizing']);
    const p1 = noiseNumber(demo.noise, ['defaults', 'gates', 'single', 'depolarizing']);
    const flip = noiseNumber(demo.noise, ['defaults', 'gates', 'measure', 'flip']);
    // An estimate, factor by factor: the BSM's CNOT and H depolarize (Nielsen & Chuang §8.3,
    // F′ = (1−p)F + p/4, here rounded down to (1−p)F), and a flipped readout bit applies the
    // wrong correction (common practice); 0.005 more is allowed for T2 decay in flight.
    const estimate = swapWerner(f, f) * (1 - p2) * (1 - p1) * (1 - flip) ** 2;
    const mean = meanFidelity(s);
    expect(mean).toBeLessThan(swapWerner(f, f));
    expect(mean).toBeGreaterThan(estimate - 0.005);
  });
});

describe('two-site-purification', () => {
  const demo = loadDemo('two-site-purification');
  const f = noiseNumber(demo.noise, ['defaults', 'link', 'pair', 'werner']);
  // DEJMPS 1996 on Werner inputs (for Werner inputs the first round agrees with BBPSSW 1996)
  const round = dejmps(werner(f));

  it('keeps pairs of the DEJMPS fidelity, at the DEJMPS rate, when gates and memories are ideal', async () => {
    const { s } = await runJson(demo, RUN, { noise: idealNoise(demo.noise) });
    for (const d of s.delivered) expect(d.fidelity).toBeCloseTo(round.out[0], 9);
    expect(round.out[0]).toBeCloseTo(bbpssw(f).f, 12);
    const rounds = s.fired.fen.conclude;
    expect(rounds).toBeGreaterThan(200);
    // about 300 rounds: a binomial standard deviation near 0.02, so 0.06 is three of them
    expect(Math.abs(s.delivered.length / rounds - round.p)).toBeLessThan(0.06);
  });

  it('delivers pairs better than the link makes them, with the demo noise', async () => {
    const { code, s } = await runJson(demo, [...RUN, '--expect', `min_fidelity_delivered() > ${f}`, '--expect', 'delivered(fen, loft) > 100']);
    expect(code).toBe(0);
    expect(s.expectations.every((e) => e.ok)).toBe(true);
    expect(meanFidelity(s)).toBeGreaterThan(f);
    expect(meanFidelity(s)).toBeLessThan(round.out[0]);
  });
});

describe('stalled-purification', () => {
  const demo = loadDemo('stalled-purification');

  it('stalls, and the report shows both ends waiting for a message about the pair the other did not keep', async () => {
    const { code, s } = await runJson(demo, ['--expect', 'stalled()', '--expect', 'delivered() == 0']);
    expect(code).toBe(1);
    expect(s.stop.reason).toBe('stall');
    expect(s.expectations.map((e) => e.ok)).toEqual([true, true]);
    expect(Object.keys(s.stall ?? {}).sort()).toEqual(['kiln', 'weir']);
    const waits = (node: string) => {
      const entry = s.stall![node].find((e) => e.rule === 'conclude');
      const m = /about pair (\S+); the inbox holds one about (\S+)$/.exec(entry?.reason ?? '');
      expect(m, `${node}.conclude: ${entry?.reason}`).not.toBeNull();
      return { wants: m![1], holds: m![2] };
    };
    const kiln = waits('kiln');
    const weir = waits('weir');
    expect(kiln.wants).not.toBe(kiln.holds);
    expect(kiln.wants).toBe(weir.holds);
    expect(weir.wants).toBe(kiln.holds);
    for (const node of ['kiln', 'weir']) expect(s.stall![node].map((e) => e.rule).sort()).toEqual(['conclude', 'start']);
  });

  it('prints the waiting rules of both sites in the text report', async () => {
    const r = await cliOn(demo, 'run');
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/^stopped: stall/);
    for (const rule of ['kiln.start', 'kiln.conclude', 'weir.start', 'weir.conclude']) expect(r.stdout).toContain(`  ${rule}: waits for`);
  });

  it('runs as BBPSSW once weir picks its oldest pair too, as the README says', async () => {
    const fixed = withPick(demo.net, 'weir', 'start', 'oldest');
    const f = noiseNumber(demo.noise, ['defaults', 'link', 'pair', 'werner']);
    const { code, s } = await runJson(demo, ['--until', '100ms'], { net: fixed, noise: idealNoise(demo.noise) });
    expect(code).toBe(0);
    expect(s.stop.reason).toBe('until');
    expect(s.delivered.length).toBeGreaterThan(100);
    // BBPSSW 1996, Werner inputs: F′ = (F² + (1−F)²/9) / p
    for (const d of s.delivered) expect(d.fidelity).toBeCloseTo(bbpssw(f).f, 9);
  });
});

describe('lost-message', () => {
  const demo = loadDemo('lost-message');

  it('drops one parity message, gives up on that round once, and goes on delivering', async () => {
    const { code, s } = await runJson(demo, RUN);
    expect(code).toBe(0);
    expect(s.stop.reason).toBe('until');
    expect(s.messages.dropped).toBe(1);
    expect(s.fired.vale['give-up']).toBe(1);
    expect(s.fired.tarn.abandon).toBe(1);
    expect(s.delivered.length).toBeGreaterThan(100);
  });

  it('gives up 3 ms after start moved the kept half to waiting, to the nanosecond, and delivers again afterwards', async () => {
    const r = await cliOn(demo, 'run', [...RUN, '--break', 'on fire tarn.abandon', '--record', 'r.json']);
    expect(r.stdout).toMatch(/^stopped: breakpoint/);
    const events = replayLines(r.files.get('r.json')!);
    const at = events.findIndex((e) => e.summary.includes('fired vale.give-up'));
    const giveUp = events[at];
    expect(giveUp.summary).toContain('vale woke (stage timer)');
    // the round whose parity message was lost: the last start before the give-up (its two
    // halves at tarn then fill the link's slots, so no other round can begin)
    const start = events.slice(0, at).reverse().find((e) => e.summary.includes('fired vale.start'))!;
    // start's steps before "stage": two rx gates, a cnot and a measurement, at the demo's durations
    const dur = (k: string) => parseDuration(String(parseDocument(demo.noise).getIn(['defaults', 'gates', k, 'duration'])));
    const staged = start.time_ns + 2 * dur('single') + dur('two') + dur('measure');
    expect(giveUp.time_ns - staged).toBe(3_000_000);
    const { s } = await runJson(demo, RUN);
    expect(s.delivered.filter((d) => d.time_ns > giveUp.time_ns).length).toBeGreaterThan(50);
  });

  it('gives up once in 5 s of simulated time, for the one lost message, and tarn abandons once', async () => {
    const { s } = await runJson(demo, ['--until', '5s']);
    expect(s.messages.dropped).toBe(1);
    expect(s.fired.vale['give-up']).toBe(1);
    expect(s.fired.tarn.abandon).toBe(1);
  });

  it('stalls without the time-out, with vale waiting for a verdict and tarn for a parity message', async () => {
    const net = withoutRules(withoutRules(demo.net, 'vale', ['give-up']), 'tarn', ['abandon']);
    const { code, s } = await runJson(demo, RUN, { net });
    expect(code).toBe(1);
    expect(s.stop.reason).toBe('stall');
    expect(s.messages.dropped).toBe(1);
    expect(s.stall!.vale.find((e) => e.rule === 'conclude')?.reason).toMatch(/"verdict"/);
    expect(s.stall!.tarn.find((e) => e.rule === 'answer')?.reason).toMatch(/"parity"/);
  });
});

describe('nested-repeater', () => {
  const demo = loadDemo('nested-repeater');

  it('delivers only alder~elm pairs, steadily, and its cut-offs fire and are told to the far end', async () => {
    const { code, s } = await runJson(demo, [...RUN, '--expect', 'delivered(alder, elm) == delivered()']);
    expect(code).toBe(0);
    expect(s.expectations[0].ok).toBe(true);
    const n = s.delivered.length;
    expect(n).toBeGreaterThan(40);
    for (const d of s.delivered) expect(d.ends).toEqual(['alder', 'elm']);
    // steadily: every quarter of the run has at least a third of its even share
    for (let q = 0; q < 4; q++) {
      const inQuarter = s.delivered.filter((d) => d.time_ns >= q * 50e6 && d.time_ns < (q + 1) * 50e6).length;
      expect(inQuarter, `quarter ${q + 1}`).toBeGreaterThanOrEqual(n / 12);
    }
    const f = s.fired;
    const cutOffs = Object.values(f).flatMap((rules) => Object.entries(rules).filter(([r]) => r.startsWith('cut-off-')).map(([, c]) => c));
    expect(cutOffs.reduce((a, b) => a + b, 0)).toBeGreaterThan(0);
    expect(f.alder.expired).toBe(f.birch['cut-off-alder'] + f.cedar['cut-off-alder']);
    expect(f.elm.expired).toBe(f.dune['cut-off-elm'] + f.cedar['cut-off-elm']);
    expect(f.cedar.expired).toBe(f.birch['cut-off-cedar'] + f.dune['cut-off-cedar']);
  });

  it('delivers the fidelity of four purified links swapped together when gates and memories are ideal', async () => {
    const { s } = await runJson(demo, RUN, { noise: idealNoise(demo.noise) });
    const f = noiseNumber(demo.noise, ['defaults', 'link', 'pair', 'werner']);
    // DEJMPS 1996 on each link, then the Bell-diagonal swap (common practice) at birch, dune and cedar
    const link = dejmps(werner(f)).out;
    const endToEnd = swapBell(swapBell(link, link), swapBell(link, link));
    expect(s.delivered.length).toBeGreaterThan(40);
    for (const d of s.delivered) expect(d.fidelity).toBeCloseTo(endToEnd[0], 9);
  });

  it('loses fidelity to the demo noise but stays far above a classical mixture', async () => {
    const { s } = await runJson(demo, RUN);
    const f = noiseNumber(demo.noise, ['defaults', 'link', 'pair', 'werner']);
    const link = dejmps(werner(f)).out;
    const ideal = swapBell(swapBell(link, link), swapBell(link, link))[0];
    expect(meanFidelity(s)).toBeLessThan(ideal);
    // above 1/2 the pairs are entangled (common practice)
    expect(s.delivered.every((d) => d.fidelity > 0.5)).toBe(true);
  });
});
