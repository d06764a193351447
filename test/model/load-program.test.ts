import { describe, it, expect } from 'vitest';
import { loadProgramSet } from '../../src/model/load-program.js';
import type { BellMeasureStep, HaveGuard, HaveIdGuard, LogStep, SendStep } from '../../src/model/types.js';
import { fixture, inputErrors, where } from './helpers.js';

const FILE = 'swap.net.yaml';
const text = fixture(FILE);

describe('loadProgramSet on the three-site swap fixture', () => {
  const ps = loadProgramSet(FILE, text);

  it('keeps the file, its text and the title', () => {
    expect(ps.file).toBe(FILE);
    expect(ps.text).toBe(text);
    expect(ps.title).toBe('one swap at mill joins quay and ridge');
  });

  it('reads nodes and links with sorted ends, metres and positions', () => {
    expect(ps.nodes.map((n) => [n.id, n.qubits])).toEqual([
      ['quay', 2],
      ['mill', 4],
      ['ridge', 2],
    ]);
    expect(ps.links.map((l) => [l.id, l.ends, l.lengthM, l.slots])).toEqual([
      ['mill~quay', ['mill', 'quay'], 12_000, 2],
      ['mill~ridge', ['mill', 'ridge'], 9_500, 2],
    ]);
    expect(ps.links[0].pos).toEqual({ file: FILE, ...where(text, 'ends: [quay, mill]') });
    expect(ps.nodes[1].pos).toEqual({ file: FILE, ...where(text, 'id: mill') });
  });

  it('gives every node with rules a program, in rule order, with positions', () => {
    expect(Object.keys(ps.programs).sort()).toEqual(['mill', 'quay', 'ridge']);
    const swap = ps.programs.mill.rules[0];
    expect(swap.name).toBe('swap');
    expect(swap.node).toBe('mill');
    expect(swap.index).toBe(0);
    expect(swap.pos).toEqual({ file: FILE, ...where(text, 'name: swap') });
  });

  it('fills have defaults: stage link, pick oldest, count from the names', () => {
    const left = ps.programs.mill.rules[0].when[0] as HaveGuard;
    expect(left.kind).toBe('have');
    expect(left.stage).toBe('link');
    expect(left.pick).toBe('oldest');
    expect(left.count).toBe(1);
    expect(left.as).toEqual(['left']);
    expect(left.partner.compiled.source).toBe('quay');
    const at = where(text, 'have: {partner: quay, as: left}');
    expect(left.pos).toEqual({ file: FILE, ...at });
    // the expression's text starts after "have: {partner: "
    expect(left.partner.pos).toEqual({ file: FILE, line: at.line, col: at.col + 'have: {partner: '.length });
  });

  it('reads have-by-id after a got and keeps the message binding', () => {
    const [got, have] = ps.programs.quay.rules[0].when;
    expect(got).toMatchObject({ kind: 'got', msgKind: 'swapped', as: 'm' });
    expect(got.kind === 'got' && got.from?.compiled.source).toBe('mill');
    const byId = have as HaveIdGuard;
    expect(byId.kind).toBe('have-id');
    expect(byId.id.compiled.source).toBe('m.pair');
    expect(byId.as).toBe('p');
    expect(byId.stage).toBeUndefined();
  });

  it('reads the swap body: Bell-state measurement, sends with data, a log template', () => {
    const body = ps.programs.mill.rules[0].do;
    expect(body.map((s) => s.kind)).toEqual(['bell_measure', 'send', 'send', 'log']);
    const bsm = body[0] as BellMeasureStep;
    expect(bsm.on).toEqual(['left', 'right']);
    expect(bsm.as).toEqual(['zbit', 'xbit']);
    const bits = body[1] as SendStep;
    expect(bits.msgKind).toBe('bits');
    expect(bits.to.compiled.source).toBe('ridge');
    expect(bits.pair?.compiled.source).toBe('right.id');
    expect(Object.keys(bits.data)).toEqual(['z', 'x', 'far', 'far_id']);
    const log = body[3] as LogStep;
    const holes = log.parts.filter((p) => typeof p !== 'string');
    expect(log.parts.filter((p) => typeof p === 'string')).toEqual(['swapped ', ' with ', ': bits ']);
    expect(holes).toHaveLength(4);
  });

  it('reads corrections and rebinds at ridge', () => {
    const body = ps.programs.ridge.rules[0].do;
    expect(body.map((s) => s.kind)).toEqual(['correct', 'rebind', 'deliver']);
    expect(body[0].kind === 'correct' && [body[0].x?.compiled.source, body[0].z?.compiled.source]).toEqual(['m.x', 'm.z']);
    expect(body[1].kind === 'rebind' && body[1].id?.compiled.calls).toEqual(['join']);
    expect(body[2]).toMatchObject({ kind: 'deliver', pair: 'p' });
  });
});

const minimal = (programs: string) => `format: bellstep/program-set@1
nodes:
  - {id: quay, qubits: 2}
  - {id: mill, qubits: 2}
links:
  - {ends: [mill, quay], length: 300 m, slots: 2}
programs:
${programs}`;

describe('loadProgramSet semantics', () => {
  it('turns YAML numbers and booleans into literal expressions', () => {
    const ps = loadProgramSet(
      'n.yaml',
      minimal(`  quay:
    rules:
      - name: r
        when: [{have: {partner: mill, as: p}}, {check: true}]
        do:
          - gate: {op: rx, on: p, angle: 1.5}
          - note: {pair: p, set: {round: 2, good: false}}
`),
    );
    const rule = ps.programs.quay.rules[0];
    expect(rule.when[1].kind === 'check' && rule.when[1].expr.compiled.ast).toMatchObject({ type: 'literal', value: true });
    const gate = rule.do[0];
    expect(gate.kind === 'gate' && gate.angle?.compiled.ast).toMatchObject({ type: 'literal', value: 1.5 });
    const note = rule.do[1];
    expect(note.kind === 'note' && note.set.good.compiled.ast).toMatchObject({ type: 'literal', value: false });
  });

  it('takes count from the list of names, pick newest and ages in nanoseconds', () => {
    const ps = loadProgramSet(
      'n.yaml',
      minimal(`  quay:
    rules:
      - name: r
        when: [{have: {partner: mill, as: [a, b], pick: newest, min_age: 2 ms, max_age: 1.5 s}}]
        do: [{discard: a}, {discard: b}]
`),
    );
    const h = ps.programs.quay.rules[0].when[0] as HaveGuard;
    expect(h.count).toBe(2);
    expect(h.pick).toBe('newest');
    expect(h.minAgeNs).toBe(2 * 1e6);
    expect(h.maxAgeNs).toBe(1.5 * 1e9);
  });

  it('scopes names bound in an if branch to that branch', () => {
    const ok = minimal(`  quay:
    rules:
      - name: r
        when: [{have: {partner: mill, as: p}}]
        do:
          - if: "now() > 0"
            then:
              - measure: {on: p, as: b}
              - log: "bit {b}"
            else:
              - discard: p
`);
    expect(() => loadProgramSet('n.yaml', ok)).not.toThrow();
    const bad = ok.replace('              - discard: p', '              - log: "bit {b}"');
    const errs = inputErrors(() => loadProgramSet('n.yaml', bad));
    expect(errs.map((e) => e.message).join('\n')).toContain('"b" is not visible here');
  });

  it('reports several problems of one file in one pass, in file order', () => {
    const t = minimal(`  quay:
    rules:
      - name: r
        when: [{have: {partner: mill, as: quay}}]
        do: [{discard: nothere}]
      - name: r
        when: [{check: "fired(quay, r) > 1"}]
        do: []
`);
    const errs = inputErrors(() => loadProgramSet('n.yaml', t));
    expect(errs.length).toBeGreaterThanOrEqual(4);
    const lines = errs.map((e) => e.line ?? 0);
    expect([...lines].sort((a, b) => a - b)).toEqual(lines);
    const all = errs.map((e) => e.message).join('\n');
    expect(all).toContain('may not bind "quay"');
    expect(all).toContain('unknown pair "nothere"');
    expect(all).toContain('duplicate rule name "r"');
    expect(all).toContain('fired() is a debugger function');
  });
});
