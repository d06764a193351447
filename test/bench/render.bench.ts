/**
 * Frame cost of the debugger on a 64-site chain against a 5-site one, at 80×24 and at
 * 160×50: a key (→ or ←) goes to the live app, the controller moves the cursor between two
 * events so no pane is served from its cache, the app builds the frame from the session
 * (views, explanations, timeline) and the screen writes its changed rows, with colour, to a
 * sink (the median of 70 frames). Goals: the large network costs at most twice the small
 * one, and a frame stays under 16.7 ms. A last line measures Ink's own output on the same
 * frame as text, for comparison: it rebuilds every cell on every frame.
 */
import { formatNs, type BenchLine } from './harness.js';

/** A chain of `n` sites: links make pairs, each site trims a second pair to its right and tells that neighbour, who logs it. */
function chain(n: number): string {
  const names = Array.from({ length: n }, (_, i) => `s${i}`);
  const nodes = names.map((id) => `  - {id: ${id}, qubits: 4}`).join('\n');
  const links = names.slice(1).map((id, i) => `  - {ends: [${names[i]}, ${id}], length: 5 km, slots: 2}`).join('\n');
  const programs = names
    .map((id, i) => {
      const rules: string[] = [];
      if (i < n - 1) {
        rules.push(`      - name: trim
        when:
          - have: {partner: ${names[i + 1]}, count: 2, as: [a, b]}
        do:
          - discard: b
          - send: {to: ${names[i + 1]}, kind: trimmed, pair: b.id}`);
      }
      if (i > 0) {
        rules.push(`      - name: hear
        when:
          - got: {from: ${names[i - 1]}, kind: trimmed, as: m}
          - have: {id: m.pair, as: p}
        do:
          - discard: p`);
      }
      return `  ${id}:\n    rules:\n${rules.join('\n')}`;
    })
    .join('\n');
  return `format: bellstep/program-set@1\ntitle: chain of ${n}\nnodes:\n${nodes}\nlinks:\n${links}\nprograms:\n${programs}\n`;
}

const NOISE = `format: bellstep/noise@1
seed: 5
defaults:
  link:
    pair: {werner: 0.92}
    success: 0.2
  memory: {t2: 1 s}
  classical: {speed: 200000 km/s}
`;

/** The median of a list of timings. */
function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

export default async (): Promise<BenchLine[]> => {
  // React's development build costs several times more per render; the bin sets this too
  process.env.NODE_ENV = 'production';
  const React = await import('react');
  const { render, Text } = await import('ink');
  const { PassThrough } = await import('node:stream');
  const { loadInputs } = await import('../../src/model/index.js');
  const { Engine } = await import('../../src/engine/index.js');
  const { Session } = await import('../../src/session/session.js');
  const { Controller } = await import('../../src/tui/controller.js');
  const { DebuggerApp } = await import('../../src/tui/app.js');
  const { TerminalScreen, composeRows } = await import('../../src/tui/screen.js');
  const { buildFrame } = await import('../../src/tui/frame.js');
  type Key = Parameters<InstanceType<typeof Controller>['handleKey']>[1];
  const FLAGS = ['upArrow', 'downArrow', 'pageDown', 'pageUp', 'home', 'end', 'return', 'escape', 'ctrl', 'shift', 'tab', 'backspace', 'delete', 'meta', 'super', 'hyper', 'capsLock', 'numLock'];
  const arrow = (right: boolean) => ({ ...Object.fromEntries(FLAGS.map((f) => [f, false])), rightArrow: right, leftArrow: !right }) as Key;

  const sinkOf = (cols: number, rows: number) => {
    const sink = new PassThrough();
    sink.on('data', () => {});
    return Object.assign(sink, { columns: cols, rows, isTTY: true }) as unknown as NodeJS.WriteStream;
  };
  const controllerAt = (sites: number) => {
    const { programSet, noise } = loadInputs({ netFile: 'chain.net.yaml', netText: chain(sites), noiseFile: 'chain.noise.yaml', noiseText: NOISE });
    const c = new Controller(new Session(new Engine(programSet, noise)), { defer: (fn) => fn() });
    c.selectSite(`s${Math.floor(sites / 2)}`);
    for (let i = 0; i < 400; i++) c.session.stepForward();
    return c;
  };

  /** Median wall time from a key to the frame's rows written, in a live app. */
  const frameNs = async (sites: number, cols: number, rows: number): Promise<{ ns: number; bytes: number }> => {
    const c = controllerAt(sites);
    const out = sinkOf(cols, rows);
    // no gap between frames: every key's frame is written at once
    const screen = new TerminalScreen(out, 0);
    const inst = render(React.createElement(DebuggerApp, { controller: c, screen, size: { columns: cols, rows } }), { stdout: out, patchConsole: false, exitOnCtrlC: false });
    await new Promise((r) => setImmediate(r));
    const times: number[] = [];
    let bytes = 0;
    for (let i = 0; i < 80; i++) {
      const before = screen.bytes;
      const start = process.hrtime.bigint();
      c.handleKey('', arrow(i % 2 === 0));
      // React commits the update a turn or two later; the frame is done when its rows are written
      for (let turns = 0; screen.bytes === before && turns < 1000; turns++) await new Promise((r) => setImmediate(r));
      if (screen.bytes === before) throw new Error('the debugger drew no frame after a key');
      if (i >= 10) {
        times.push(Number(process.hrtime.bigint() - start));
        bytes += screen.bytes - before;
      }
    }
    inst.unmount();
    return { ns: median(times), bytes: bytes / 70 };
  };

  /** The same frames drawn by Ink itself, as one text row per screen row: its output alone. */
  const inkNs = async (sites: number, cols: number, rows: number): Promise<number> => {
    const c = controllerAt(sites);
    const out = sinkOf(cols, rows);
    const frames = [0, 1].map((k) => {
      c.handleKey('', arrow(k === 0));
      return composeRows(buildFrame(c, cols, rows), 'colour').join('\n');
    });
    const inst = render(React.createElement(Text, null, frames[0]), { stdout: out, debug: true, patchConsole: false, exitOnCtrlC: false });
    const times: number[] = [];
    for (let i = 0; i < 40; i++) {
      const start = process.hrtime.bigint();
      inst.rerender(React.createElement(Text, null, frames[i % 2]));
      await new Promise((r) => setImmediate(r));
      if (i >= 10) times.push(Number(process.hrtime.bigint() - start));
    }
    inst.unmount();
    return median(times);
  };

  const budget = 16.7e6;
  const lines: BenchLine[] = [];
  for (const [cols, rows] of [[80, 24], [160, 50]] as const) {
    const small = await frameNs(5, cols, rows);
    const large = await frameNs(64, cols, rows);
    lines.push(
      { name: `frame at ${cols}×${rows}, 64-site chain vs 5-site chain`, ratio: large.ns / small.ns, goal: '<= 2x', ok: large.ns / small.ns <= 2, detail: `${formatNs(large.ns)} vs ${formatNs(small.ns)}` },
      { name: `frame at ${cols}×${rows}, 64-site chain vs the 16.7 ms budget`, ratio: large.ns / budget, goal: '<= 1', ok: large.ns <= budget, detail: `${formatNs(large.ns)}, ${Math.round(large.bytes)} bytes written a frame` },
      { name: `frame at ${cols}×${rows}, 5-site chain vs the 16.7 ms budget`, ratio: small.ns / budget, goal: '<= 1', ok: small.ns <= budget, detail: `${formatNs(small.ns)}, ${Math.round(small.bytes)} bytes written a frame` },
    );
  }
  const ink = await inkNs(64, 160, 50);
  lines.push({ name: "Ink's own output of the same 160×50 frame (for comparison, no goal)", ratio: ink / budget, goal: 'reference', ok: true, detail: `${formatNs(ink)} a frame` });
  return lines;
};
