import { describe, it, expect } from 'vitest';
import { lint, type Finding } from '../../src/model/lint.js';
import { loadProgramSet } from '../../src/model/load-program.js';
import { fixture, where } from './helpers.js';

/** quay – mill – ridge in a line, and loft with no fiber at all. */
const net = (programs: string, slots = 2) => `format: bellstep/program-set@1
nodes:
  - {id: quay, qubits: 4}
  - {id: mill, qubits: 4}
  - {id: ridge, qubits: 4}
  - {id: loft, qubits: 1}
links:
  - {ends: [quay, mill], length: 2 km, slots: ${slots}}
  - {ends: [mill, ridge], length: 3 km, slots: ${slots}}
programs:
${programs}`;

const run = (text: string): Finding[] => lint(loadProgramSet('l.net.yaml', text));
const codes = (fs: readonly Finding[]) => fs.map((f) => f.code);

describe('lint: clean programs', () => {
  it('finds nothing in the three-site swap fixture', () => {
    expect(run(fixture('swap.net.yaml'))).toEqual([]);
  });

  it('finds nothing in a staged hand-off with messages both ways', () => {
    const t = net(`  quay:
    rules:
      - name: hold
        when: [{have: {partner: mill, as: p}}]
        do:
          - stage: {pair: p, to: waiting}
          - send: {to: mill, kind: ready, pair: p.id}
      - name: use
        when: [{got: {from: mill, kind: ack, as: m}}, {have: {id: m.pair, stage: waiting, as: p}}]
        do: [{deliver: p}]
  mill:
    rules:
      - name: answer
        when: [{got: {kind: ready, as: m}}, {have: {id: m.pair, as: p}}]
        do: [{send: {to: m.from, kind: ack, pair: p.id}}, {deliver: p}]
`);
    expect(run(t)).toEqual([]);
  });
});

describe('lint: message kinds', () => {
  it('reports a kind sent to a node where no rule waits for it, at the send', () => {
    const t = net(`  mill:
    rules:
      - name: tell
        when: [{have: {partner: quay, as: p}}]
        do: [{send: {to: quay, kind: parity}}, {discard: p}]
`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['message-unawaited']);
    expect(fs[0].message).toContain('"parity"');
    expect(fs[0].message).toContain('no rule at quay waits for it');
    expect([fs[0].line, fs[0].col]).toEqual([where(t, '{send:').line, where(t, '{send:').col]);
    expect(fs[0].file).toBe('l.net.yaml');
    expect(fs[0].fix).toContain('got: {kind: parity}');
  });

  it('counts only the named sender when a got names one', () => {
    const t = net(`  mill:
    rules:
      - name: tell
        when: [{have: {partner: quay, as: p}}]
        do: [{send: {to: quay, kind: parity}}, {discard: p}]
  quay:
    rules:
      - name: hear
        when: [{got: {from: ridge, kind: parity}}]
        do: []
`);
    const fs = run(t);
    expect(codes(fs).sort()).toEqual(['message-unawaited', 'rule-dead']);
    expect(fs.find((f) => f.code === 'rule-dead')?.message).toContain('"parity" from ridge, which no rule sends to quay');
  });

  it('names both spellings in one finding when the kinds differ by a typo', () => {
    const t = net(`  mill:
    rules:
      - name: tell
        when: [{have: {partner: ridge, as: p}}]
        do: [{send: {to: ridge, kind: bits, pair: p.id}}, {discard: p}]
  ridge:
    rules:
      - name: fix
        when: [{got: {from: mill, kind: bitz, as: m}}]
        do: []
`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['message-typo']);
    expect(fs[0].message).toContain('"bits"');
    expect(fs[0].message).toContain('"bitz"');
    expect(fs[0].line).toBe(where(t, 'got: {from: mill, kind: bitz').line);
  });
});

describe('lint: stages', () => {
  it('reports a stage entered but never matched, at the stage step', () => {
    const t = net(`  quay:
    rules:
      - name: park
        when: [{have: {partner: mill, as: p}}]
        do: [{stage: {pair: p, to: parked}}]
`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['stage-unmatched']);
    expect(fs[0].message).toContain('"parked"');
    expect(fs[0].line).toBe(where(t, 'stage: {pair: p, to: parked}').line);
  });

  it('reports a stage expected but never entered, at the have', () => {
    const t = net(`  quay:
    rules:
      - name: use
        when: [{have: {partner: mill, stage: purified, as: p}}]
        do: [{deliver: p}]
`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['stage-unentered']);
    expect(fs[0].message).toContain('"purified"');
    expect(fs[0].message).toContain('can never fire');
  });

  it('names both spellings of a stage typo in one finding', () => {
    const t = net(`  quay:
    rules:
      - name: park
        when: [{have: {partner: mill, as: p}}]
        do: [{stage: {pair: p, to: ready}}]
      - name: use
        when: [{have: {partner: mill, stage: redy, as: p}}]
        do: [{deliver: p}]
`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['stage-typo']);
    expect(fs[0].message).toContain('"ready"');
    expect(fs[0].message).toContain('"redy"');
  });

  it('treats link as always entered and a have by id without a stage as matching any stage', () => {
    const t = net(`  quay:
    rules:
      - name: park
        when: [{have: {partner: mill, as: p}}]
        do: [{stage: {pair: p, to: parked}}, {send: {to: mill, kind: parked, pair: p.id}}]
      - name: done
        when: [{got: {kind: done, as: m}}, {have: {id: m.pair, as: p}}]
        do: [{deliver: p}]
  mill:
    rules:
      - name: reply
        when: [{got: {kind: parked, as: m}}, {have: {id: m.pair, as: p}}]
        do: [{send: {to: quay, kind: done, pair: p.id}}, {deliver: p}]
`);
    expect(run(t)).toEqual([]);
  });
});

describe('lint: partners that cannot be reached', () => {
  it('reports a have whose partner is the node itself', () => {
    const fs = run(net(`  mill:\n    rules:\n      - {name: r, when: [{have: {partner: mill}}], do: []}\n`));
    expect(codes(fs)).toEqual(['partner-self']);
  });

  it('reports a have and a send towards a node with no fiber path', () => {
    const t = net(`  mill:
    rules:
      - name: r
        when: [{have: {partner: loft, as: p}}]
        do: [{send: {to: loft, kind: hello}}]
`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['partner-unreachable', 'partner-unreachable']);
    expect(fs.map((f) => f.line)).toEqual([where(t, 'partner: loft').line, where(t, 'to: loft').line]);
    expect(fs[1].message).toContain('no path joins mill and loft');
  });

  it('reports a send to the node itself once', () => {
    const fs = run(net(`  mill:\n    rules:\n      - {name: r, when: [{have: {partner: quay, as: p}}], do: [{send: {to: mill, kind: note}}, {discard: p}]}\n`));
    expect(codes(fs)).toEqual(['partner-self']);
  });
});

describe('lint: rules that can never fire', () => {
  it('reports a have needing more link pairs than the link has slots, at the rule', () => {
    const t = net(`  quay:
    rules:
      - name: greedy
        when: [{have: {partner: mill, count: 3, as: [a, b, c]}}]
        do: [{discard: a}, {discard: b}, {discard: c}]
`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['rule-dead']);
    expect(fs[0].line).toBe(where(t, 'name: greedy').line);
    expect(fs[0].message).toContain(`its have guard (line ${where(t, 'have:').line})`);
    expect(fs[0].message).toContain('only 2 slots');
    // with enough slots the rule is fine
    expect(run(t.replaceAll('slots: 2', 'slots: 3').replaceAll('qubits: 4', 'qubits: 6'))).toEqual([]);
  });

  it('does not count slots when some rule at the node stages pairs back into link', () => {
    const t = net(`  quay:
    rules:
      - name: greedy
        when: [{have: {partner: mill, count: 3, as: [a, b, c]}}]
        do: [{discard: a}, {discard: b}, {discard: c}]
      - name: back
        when: [{have: {partner: mill, stage: spare, as: p}}]
        do: [{stage: {pair: p, to: link}}]
      - name: aside
        when: [{have: {partner: mill, as: p}}]
        do: [{stage: {pair: p, to: spare}}]
`);
    expect(codes(run(t))).not.toContain('rule-dead');
  });

  it('reports a non-neighbour partner when no rule anywhere swaps', () => {
    const t = net(`  quay:
    rules:
      - name: far
        when: [{have: {partner: ridge, as: p}}]
        do: [{deliver: p}]
`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['rule-dead']);
    expect(fs[0].message).toContain('not a neighbour');
    // a Bell-state measurement somewhere makes such pairs possible
    const withSwap = `${t}  mill:
    rules:
      - name: swap
        when: [{have: {partner: quay, as: a}}, {have: {partner: ridge, as: b}}]
        do: [{bell_measure: {on: [a, b], as: [z, x]}}]
`;
    expect(codes(run(withSwap))).not.toContain('rule-dead');
  });

  it('reports a check that is the literal false', () => {
    const t = net(`  quay:\n    rules:\n      - name: off\n        when: [{have: {partner: mill, as: p}}, {check: false}]\n        do: [{discard: p}]\n`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['rule-dead']);
    expect(fs[0].message).toContain('always false');
    expect(fs[0].line).toBe(where(t, 'name: off').line);
  });

  it('reports a got whose kind no rule sends to that node, at the rule', () => {
    const t = net(`  ridge:\n    rules:\n      - name: wait\n        when: [{got: {kind: ack}}]\n        do: []\n`);
    const fs = run(t);
    expect(codes(fs)).toEqual(['rule-dead']);
    expect(fs[0].line).toBe(where(t, 'name: wait').line);
    expect(fs[0].message).toContain('its got guard');
  });
});
