/**
 * Every error in a file is reported in one pass: a schema error in one entry no longer
 * hides an unknown node, a misspelt name or a wrong number elsewhere in the same file.
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { SWAP_NET } from '../engine/scenarios.js';

const NET = `format: bellstep/program-set@1
nodes:
  - {id: quay, qubits: two}
  - {id: mill, qubits: 2}
links:
  - {ends: [quay, mill], length: 1 km, slots: 1}
  - {ends: [mill, ridge], length: 1 km, slots: 1}
programs:
  mill:
    rules:
      - name: a
        when: [{have: {partner: quay, as: p, colour: red}}]
        do: [{discard: p}]
      - name: b
        when: [{have: {partner: qauy, as: p}}]
        do: [{discard: q}]
  fen:
    rules: []
`;

describe('one pass over a file', () => {
  it('reports the schema errors and the reference errors of a program set together, in file order', async () => {
    const r = await runCli(['check', 'n.net.yaml'], { 'n.net.yaml': NET });
    expect(r.code).toBe(2);
    const located = [...r.stderr.matchAll(/n\.net\.yaml:(\d+):\d+: (\S+): /g)].map((m) => [Number(m[1]), m[2]]);
    expect(located).toEqual([
      [3, 'nodes[0].qubits'],
      [7, 'links[1].ends[1]'],
      [12, 'programs.mill.rules[0].when[0].have.colour'],
      [15, 'programs.mill.rules[1].when[0].have.partner'],
      [16, 'programs.mill.rules[1].do[0].discard'],
      [17, 'programs.fen'],
    ]);
    expect(r.stderr).toContain('unknown node "ridge"');
    expect(r.stderr).toContain('unknown name "qauy" (did you mean "quay"?)');
    // quay's entry is wrong, but quay is declared: nothing that names it is reported again
    expect(r.stderr).not.toContain('unknown node "quay"');
  });

  it('reports a noise model’s schema errors with its zero decay time and its unknown nodes', async () => {
    const noise = `format: bellstep/noise@1
seed: 3
defaults:
  link: {pair: {werner: 1.2}}
  memory: {t1: 0 ns}
links:
  mill~quay: {success: 0.5}
  mill~ridge: {success: 2}
nodes:
  fen: {memory: {t2: 1 s}}
faults:
  - delay: {from: mill, by: 5}
  - drop: {from: mill, to: fen, kind: swapped, nth: 1}
`;
    const r = await runCli(['check', 'n.net.yaml', '--noise', 'x.noise.yaml'], { 'n.net.yaml': SWAP_NET, 'x.noise.yaml': noise });
    expect(r.code).toBe(2);
    const fields = [...r.stderr.matchAll(/x\.noise\.yaml:\d+:\d+: (\S+): /g)].map((m) => m[1]);
    expect(fields).toEqual(['defaults.link.pair.werner', 'defaults.memory.t1', 'links.mill~ridge.success', 'nodes.fen', 'faults[0].delay.by', 'faults[1].drop.to']);
  });
});
