/**
 * Frame cost of the debugger on a 64-site chain against a 5-site one: building the frame
 * from the session (views, explanations, timeline) and rendering it with Ink, at 80×24
 * and at 160×50, with the cursor moving between two events so no pane is served from its
 * cache, in a live Ink instance (the median of 70 frames). Goals: the large network
 * costs at most twice the small one, and a frame stays under 16.7 ms. Ink's own cost
 * grows with the cells it writes (it tokenises every character of every row), so the
 * large screen is the hard case.
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
  const { render } = await import('ink');
  const { PassThrough } = await import('node:stream');
  const { loadInputs } = await import('../../src/model/index.js');
  const { Engine } = await import('../../src/engine/index.js');
  const { Session } = await import('../../src/session/session.js');
  const { Controller } = await import('../../src/tui/controller.js');
  const { buildFrame } = await import('../../src/tui/frame.js');
  const { FrameView } = await import('../../src/tui/components/frame-view.js');

  /** Median wall time of a frame in a live Ink instance: move the cursor, build the frame, render it. */
  const frameNs = async (sites: number, cols: number, rows: number): Promise<number> => {
    const { programSet, noise } = loadInputs({ netFile: 'chain.net.yaml', netText: chain(sites), noiseFile: 'chain.noise.yaml', noiseText: NOISE });
    const c = new Controller(new Session(new Engine(programSet, noise)), { defer: (fn) => fn() });
    c.selectSite(`s${Math.floor(sites / 2)}`);
    for (let i = 0; i < 400; i++) c.session.stepForward();
    const at = c.session.cursor;
    const sink = new PassThrough();
    sink.on('data', () => {});
    const out = Object.assign(sink, { columns: cols, rows, isTTY: true }) as unknown as NodeJS.WriteStream;
    // debug mode renders every update at once instead of throttling to maxFps
    const inst = render(React.createElement(FrameView, { frame: buildFrame(c, cols, rows), colour: true }), { stdout: out, debug: true, patchConsole: false, exitOnCtrlC: false });
    const times: number[] = [];
    for (let i = 0; i < 80; i++) {
      const start = process.hrtime.bigint();
      c.session.goto(i % 2 ? at - 1 : at);
      inst.rerender(React.createElement(FrameView, { frame: buildFrame(c, cols, rows), colour: true }));
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
      { name: `frame at ${cols}×${rows}, 64-site chain vs 5-site chain`, ratio: large / small, goal: '<= 2x', ok: large / small <= 2, detail: `${formatNs(large)} vs ${formatNs(small)}` },
      { name: `frame at ${cols}×${rows}, 64-site chain vs the 16.7 ms budget`, ratio: large / budget, goal: '<= 1', ok: large <= budget, detail: formatNs(large) },
      { name: `frame at ${cols}×${rows}, 5-site chain vs the 16.7 ms budget`, ratio: small / budget, goal: '<= 1', ok: small <= budget, detail: formatNs(small) },
    );
  }
  return lines;
};
