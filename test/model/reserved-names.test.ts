/**
 * Names every JavaScript object already has (toString, constructor, __proto__, ...) are
 * refused as node ids, rule names, stages, kinds, roles and parameters (exit 2, located),
 * and a program that gives such a name to a pair at run time runs correctly.
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';

const NET = (node: string, rule: string, stage: string, kind: string) => `format: bellstep/program-set@1
nodes:
  - {id: ${node}, qubits: 2}
  - {id: mill, qubits: 2}
links:
  - {ends: [${node}, mill], length: 1 km, slots: 2}
programs:
  mill:
    rules:
      - name: ${rule}
        when: [{have: {partner: "'${node}'", as: p}}]
        do:
          - stage: {pair: p, to: ${stage}}
          - send: {to: "'${node}'", kind: ${kind}, pair: p.id}
      - name: drop
        when: [{have: {partner: "'${node}'", stage: ${stage}, as: p}}]
        do: [{discard: p}]
`;

describe('reserved names', () => {
  it.each([
    ['a node id', NET('constructor', 'eat', 'held', 'note'), 'nodes[0].id: "constructor" is a reserved word and cannot be used as a node id'],
    ['a rule name', NET('quay', 'toString', 'held', 'note'), 'programs.mill.rules[0].name: "toString" is a reserved word and cannot be used as a rule name'],
    ['a rule name that sets a prototype', NET('quay', '__proto__', 'held', 'note'), '"__proto__" is a reserved word and cannot be used as a rule name'],
    ['a stage', NET('quay', 'eat', 'valueOf', 'note'), 'programs.mill.rules[0].do[0].stage.to: "valueOf" is a reserved word and cannot be used as a stage name'],
    ['a message kind', NET('quay', 'eat', 'held', 'hasOwnProperty'), '"hasOwnProperty" is a reserved word and cannot be used as a message kind'],
  ])('refuses %s with its place and a fix', async (_what, net, says) => {
    const r = await runCli(['check', 'r.net.yaml'], { 'r.net.yaml': net });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(says);
    expect(r.stderr).toMatch(/r\.net\.yaml:\d+:\d+: /);
    expect(r.stderr).toContain('fix: pick another name');
  });

  it('refuses them as role names and parameters', async () => {
    const net = `format: bellstep/program-set@1
nodes:
  - {id: quay, qubits: 2}
  - {id: mill, qubits: 2}
links:
  - {ends: [quay, mill], length: 1 km, slots: 2}
roles:
  valueOf:
    params: [isPrototypeOf]
    rules:
      - name: eat
        when: [{have: {partner: isPrototypeOf, as: p}}]
        do: [{discard: p}]
programs:
  mill:
    use: [{role: valueOf, args: {isPrototypeOf: quay}}]
`;
    const r = await runCli(['check', 'r.net.yaml'], { 'r.net.yaml': net });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('roles.valueOf.params[0]: "isPrototypeOf" is a reserved word');
    expect(r.stderr).toContain('"valueOf" is a reserved word and cannot be used as a role name');
    expect(r.stderr).toMatch(/r\.net\.yaml:8:3: roles\.valueOf: "valueOf" is a reserved word and cannot be used as a role name/);
  });

  it('runs a program that names a pair "toString" at run time, and counts its rules right', async () => {
    const end = (partner: string) => `    rules:
      - name: rename
        when: [{have: {partner: ${partner}, as: p}}]
        do:
          - rebind: {pair: p, id: "'toString'"}
          - deliver: p
`;
    const net = `format: bellstep/program-set@1
nodes:
  - {id: quay, qubits: 1}
  - {id: mill, qubits: 1}
links:
  - {ends: [quay, mill], length: 1 km, slots: 1}
programs:
  quay:
${end('mill')}  mill:
${end('quay')}`;
    const r = await runCli(['run', 'r.net.yaml', '--events', '3', '--json'], { 'r.net.yaml': net });
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.delivered.map((d: { id: string }) => d.id)).toEqual(['toString', 'toString', 'toString']);
    expect(s.fired).toEqual({ mill: { rename: 3 }, quay: { rename: 3 } });
  });

  it('runs notes and message data keyed by such names correctly', async () => {
    const net = `format: bellstep/program-set@1
nodes:
  - {id: quay, qubits: 1}
  - {id: mill, qubits: 1}
links:
  - {ends: [quay, mill], length: 1 km, slots: 1}
programs:
  mill:
    rules:
      - name: tell
        when: [{have: {partner: quay, as: p}}]
        do:
          - note: {pair: p, set: {toString: 7, hasOwnProperty: 2}}
          - send: {to: quay, kind: hello, pair: p.id, data: {valueOf: "p.toString + p.hasOwnProperty"}}
          - deliver: p
  quay:
    rules:
      - name: hear
        when: [{got: {from: mill, kind: hello, as: m}}, {have: {id: m.pair, as: q}}, {check: "m.valueOf == 9"}]
        do: [{deliver: q}]
`;
    const c = await runCli(['check', 'k.net.yaml'], { 'k.net.yaml': net });
    expect(c.stdout).toContain('no findings');
    const r = await runCli(['run', 'k.net.yaml', '--events', '6', '--json'], { 'k.net.yaml': net });
    expect(r.code, r.stderr).toBe(0);
    const s = JSON.parse(r.stdout);
    // hear fires only when m.valueOf read the data value 7 + 2, not the built-in function
    expect(s.fired.quay.hear).toBe(s.fired.mill.tell);
    expect(s.delivered.length).toBe(s.fired.quay.hear);
  });
});
