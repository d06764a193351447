/**
 * `bellstep chart`: the SVG of a recorded run parses as XML, names every site, draws one
 * arrow per message sent in the range, says when it is thinned, refuses bad ranges and
 * recordings it cannot reproduce, and survives any text in a title.
 */
import { readFileSync } from 'node:fs';
import { validateXML } from 'xmllint-wasm';
import { beforeAll, describe, expect, it } from 'vitest';
import { Engine } from '../../src/engine/index.js';
import { loadInputs } from '../../src/model/index.js';
import { parseReplay } from '../../src/session/replay.js';
import { ReplayWriter } from '../../src/session/replay-v2.js';
import { runHeadless } from '../../src/session/run.js';
import { niceStep, tickUnit, timeTicks } from '../../src/report/chart-axis.js';
import { runCli } from '../helpers/run-cli.js';

const NET = 'demos/nested-repeater/repeater.net.yaml';
const NOISE = 'demos/nested-repeater/repeater.noise.yaml';
const files = { [NET]: readFileSync(NET, 'utf8'), [NOISE]: readFileSync(NOISE, 'utf8') };

async function xmlErrors(svg: string): Promise<string[]> {
  const r = await validateXML({ xml: [{ fileName: 'chart.svg', contents: svg }], normalization: 'format' });
  return r.errors.map((e) => e.rawMessage);
}

function arrows(svg: string): number {
  return svg.match(/<g class="msg( lost)?">/g)?.length ?? 0;
}

/** Messages sent by events from..to of the same run, counted by the engine itself. */
function sendsIn(from: number, to: number, events: number): number {
  const { programSet, noise } = loadInputs({ netFile: NET, netText: files[NET], noiseFile: NOISE, noiseText: files[NOISE] });
  let sent = 0;
  runHeadless(new Engine(programSet, noise), { seed: noise.seed, maxEvents: events, onEvent: (ev) => void (ev.index >= from && ev.index <= to && (sent += ev.sends.length)) });
  return sent;
}

let replay: string;
beforeAll(async () => {
  const r = await runCli(['run', NET, '--noise', NOISE, '--events', '400', '--record', 'r.json'], files);
  expect(r.code).toBe(0);
  replay = r.files.get('r.json')!;
});

describe('bellstep chart', () => {
  it('writes an SVG that parses as XML, labels every site and draws one arrow per message sent', async () => {
    const r = await runCli(['chart', 'r.json', '-o', 'out.svg'], { 'r.json': replay });
    expect(r.stderr).toContain('written to out.svg');
    expect(r.code).toBe(0);
    const svg = r.files.get('out.svg')!;
    expect(await xmlErrors(svg)).toEqual([]);
    for (const site of ['alder', 'birch', 'cedar', 'dune', 'elm']) expect(svg).toContain(`>${site}</text>`);
    const sent = sendsIn(0, 399, 400);
    expect(sent).toBeGreaterThan(50);
    expect(arrows(svg)).toBe(sent);
    // the title comes from the program set, and the legend names each shape
    expect(svg).toContain('Nested repeater');
    for (const words of ['Bell-state measurement', 'other measurement', 'discard', 'delivery', 'link pair made']) expect(svg).toContain(words);
    expect(svg).not.toContain('Thinned');
  });

  it('draws the sites in network order, along the chain', async () => {
    const r = await runCli(['chart', 'r.json', '-o', 'out.svg'], { 'r.json': replay });
    const svg = r.files.get('out.svg')!;
    const xs = ['alder', 'birch', 'cedar', 'dune', 'elm'].map((s) => Number(new RegExp(`<text class="site" x="([0-9.]+)"[^>]*>${s}<`).exec(svg)![1]));
    expect([...xs].sort((a, b) => a - b)).toEqual(xs);
  });

  it('draws only the range asked for', async () => {
    const r = await runCli(['chart', 'r.json', '--from', '100', '--to', '199', '-o', 'part.svg'], { 'r.json': replay });
    expect(r.code).toBe(0);
    const svg = r.files.get('part.svg')!;
    expect(await xmlErrors(svg)).toEqual([]);
    expect(arrows(svg)).toBe(sendsIn(100, 199, 400));
    expect(svg).toContain('events 100–199 of 400');
  });

  it('thins a range of more than 5,000 events and says so', async () => {
    const long = await runCli(['run', NET, '--noise', NOISE, '--events', '6000', '--record', 'long.json'], files);
    const r = await runCli(['chart', 'long.json', '-o', 'long.svg'], { 'long.json': long.files.get('long.json')! });
    expect(r.code).toBe(0);
    const svg = r.files.get('long.svg')!;
    expect(await xmlErrors(svg)).toEqual([]);
    expect(svg).toContain('Thinned: 6,000 events is more than 5,000');
    const sent = JSON.parse((await runCli(['run', NET, '--noise', NOISE, '--events', '6000', '--json'], files)).stdout).messages.sent;
    // arrows are grouped by band and direction: fewer than the messages, and at most one per band for each way between two sites
    expect(arrows(svg)).toBeGreaterThan(0);
    expect(arrows(svg)).toBeLessThan(sent);
    expect(arrows(svg)).toBeLessThanOrEqual(200 * 8);
    // a range within the limit of the same file is drawn in full
    const part = await runCli(['chart', 'long.json', '--from', '1000', '--to', '5999', '-o', 'part.svg'], { 'long.json': long.files.get('long.json')! });
    expect(part.files.get('part.svg')).not.toContain('Thinned');
  });

  it('refuses a reversed or out-of-range --from/--to, and a missing -o, with exit 2', async () => {
    const cases: [string[], RegExp][] = [
      [['--from', '20', '--to', '10'], /--from: the range is reversed/],
      [['--to', '400'], /--to: event 400 is outside the run, which holds events 0 to 399/],
      [['--from', '-1'], /--from: expected an event index \(0 or more\), got "-1"/],
      [['--from', 'x'], /--from: expected an event index/],
    ];
    for (const [flags, message] of cases) {
      const r = await runCli(['chart', 'r.json', ...flags, '-o', 'out.svg'], { 'r.json': replay });
      expect(r.code, flags.join(' ')).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.files.has('out.svg')).toBe(false);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    }
    const noOut = await runCli(['chart', 'r.json'], { 'r.json': replay });
    expect(noOut.code).toBe(2);
    expect(noOut.stderr).toContain('-o: chart needs a file to write');
    const over = await runCli(['chart', 'r.json', '-o', 'r.json'], { 'r.json': replay });
    expect(over.code).toBe(2);
    expect(over.files.get('r.json')).toBe(replay);
  });

  it('refuses a recording that does not re-run as recorded, naming the event', async () => {
    // the file rewritten with event 57's digest changed, and re-signed
    const raw = JSON.parse(replay);
    const r = parseReplay(replay);
    const parts: string[] = [];
    const w = new ReplayWriter({ tool: raw.tool, inputs: raw.inputs, seed: raw.seed, breakpoints: raw.breakpoints, expectations: raw.expectations, limits: raw.limits }, raw.tables.nodes, (c) => void parts.push(c));
    for (let i = 0; i < r.events.length; i++) {
      const d = i === 57 ? '0123456789abcdef' : r.events.digest(i);
      w.add(r.events.time(i), r.events.node(i), r.events.kind(i), parseInt(d.slice(0, 8), 16), parseInt(d.slice(8), 16), r.events.summary(i));
    }
    w.finish(raw.stop, raw.final);
    const forged = parts.join('');
    const out = await runCli(['chart', 'f.json', '-o', 'out.svg'], { 'f.json': forged });
    expect(out.code).toBe(2);
    expect(out.stderr).toContain('f.json: events[57]: event 57 does not re-run as recorded');
    expect(out.files.has('out.svg')).toBe(false);
  });

  it('escapes every text: a title with markup and control characters still parses and reads back', async () => {
    const title = `<b>&amp; "quotes" 'and' \u0007bell</b> ]]>`;
    const net = `format: bellstep/program-set@1\ntitle: ${JSON.stringify(title)}\nnodes:\n  - {id: kiln, qubits: 1}\n  - {id: weir, qubits: 1}\nlinks:\n  - {ends: [kiln, weir], length: 2 km, slots: 1}\nprograms:\n  kiln:\n    rules:\n      - name: give\n        when: [{have: {partner: weir, as: p}}]\n        do: [{send: {to: weir, kind: ready, pair: p.id}}, {deliver: p}]\n  weir:\n    rules:\n      - name: take\n        when: [{got: {kind: ready, as: m}}, {have: {id: m.pair, as: p}}]\n        do: [{deliver: p}]\n`;
    const noise = 'format: bellstep/noise@1\nseed: 3\ndefaults:\n  link: {pair: {werner: 0.9}, success: 0.5}\n';
    const run = await runCli(['run', 'odd.net.yaml', '--noise', 'odd.noise.yaml', '--events', '30', '--record', 'odd.json'], { 'odd.net.yaml': net, 'odd.noise.yaml': noise });
    expect(run.code).toBe(0);
    const r = await runCli(['chart', 'odd.json', '-o', 'odd.svg'], { 'odd.json': run.files.get('odd.json')! });
    expect(r.code).toBe(0);
    const svg = r.files.get('odd.svg')!;
    expect(await xmlErrors(svg)).toEqual([]);
    expect(svg).toContain('&lt;b&gt;&amp;amp; "quotes" \'and\' \\u0007bell&lt;/b&gt; ]]&gt;');
    expect(svg).toContain('>ready</text>');
  });
});

describe('time labels', () => {
  it('steps by 1, 2 or 5 times a power of ten', () => {
    expect([niceStep(3), niceStep(130), niceStep(4_000_000), niceStep(0.4)]).toEqual([5, 200, 5_000_000, 1]);
  });

  it('uses one unit per chart that fits the times shown, with the decimals the step needs', () => {
    expect(tickUnit(500_000, 3_200_000)).toEqual({ unit: 'ms', size: 1e6, decimals: 1 });
    expect(tickUnit(2e9, 12e9)).toEqual({ unit: 's', size: 1e9, decimals: 0 });
    // a narrow range late in a run keeps its labels apart
    expect(tickUnit(50, 3_200_000)).toEqual({ unit: 'µs', size: 1e3, decimals: 2 });
    expect(timeTicks(0, 2_000_000, 4).map((t) => t.label)).toEqual(['0.0 ms', '0.5 ms', '1.0 ms', '1.5 ms', '2.0 ms']);
  });
});
