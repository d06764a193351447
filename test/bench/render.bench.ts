/**
 * Frame cost of the debugger on a 64-site chain against a 5-site one: building the frame
 * from the session (views, explanations, timeline) and rendering it with Ink at 160×50,
 * with the cursor moving between two events so no pane is served from its cache. Goals:
 * the large network costs at most twice the small one, and a frame stays under 16.7 ms.
 */
import { formatNs, timePerCall, type BenchLine } from './harness.js';

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

export default async (): Promise<BenchLine[]> => {
  // React's development build costs several times more per render; the bin sets this too
  process.env.NODE_ENV = 'production';
  const React = await import('react');
  const { renderToString } = await import('ink');
  const { loadInputs } = await import('../../src/model/index.js');
  const { Engine } = await import('../../src/engine/index.js');
  const { Session } = await import('../../src/session/session.js');
  const { Controller } = await import('../../src/tui/controller.js');
  const { buildFrame } = await import('../../src/tui/frame.js');
  const { FrameView } = await import('../../src/tui/components/frame-view.js');

  const frameNs = (sites: number): number => {
    const { programSet, noise } = loadInputs({ netFile: 'chain.net.yaml', netText: chain(sites), noiseFile: 'chain.noise.yaml', noiseText: NOISE });
    const c = new Controller(new Session(new Engine(programSet, noise)), { defer: (fn) => fn() });
    c.selectSite(`s${Math.floor(sites / 2)}`);
    for (let i = 0; i < 400; i++) c.session.stepForward();
    const at = c.session.cursor;
    let flip = false;
    return timePerCall(() => {
      flip = !flip;
      c.session.goto(flip ? at - 1 : at);
      const frame = buildFrame(c, 160, 50);
      renderToString(React.createElement(FrameView, { frame, colour: true }), { columns: 160 });
    }, 600);
  };

  const small = frameNs(5);
  const large = frameNs(64);
  const budget = 16.7e6;
  return [
    { name: 'frame, 64-site chain vs 5-site chain (160×50)', ratio: large / small, goal: '<= 2x', ok: large / small <= 2, detail: `${formatNs(large)} vs ${formatNs(small)}` },
    { name: 'frame of the 64-site chain vs the 16.7 ms frame budget', ratio: large / budget, goal: '<= 1', ok: large <= budget, detail: formatNs(large) },
    { name: 'frame of the 5-site chain vs the 16.7 ms frame budget', ratio: small / budget, goal: '<= 1', ok: small <= budget, detail: formatNs(small) },
  ];
};
