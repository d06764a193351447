/**
 * A corpus of broken inputs, each run through the real `bellstep check` and expected to
 * exit 2 with a message a person can act on, at the right file:line:col, and no stack trace.
 */
import { describe, it, expect } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { fixture, where } from './helpers.js';

const NET = fixture('swap.net.yaml');
const NOISE = fixture('swap.noise.yaml');

/** The text with `from` replaced by `to`; fails loudly if `from` is not there, so no case is a silent no-op. */
function edit(text: string, from: string, to: string): string {
  if (!text.includes(from)) throw new Error(`corpus edit: "${from}" not found`);
  return text.replace(from, to);
}

interface Case {
  readonly name: string;
  readonly net?: string;
  readonly noise?: string;
  /** Extra arguments; the default is `check net.yaml` plus `--noise noise.yaml` when a noise text is given. */
  readonly argv?: string[];
  /** A fragment the error output must contain. */
  readonly says: string;
  /** Text whose first occurrence (in the file named by `in`) is where the error must point; a "|" in it marks the exact column. */
  readonly at?: string;
  readonly in?: 'net' | 'noise';
  /** Explicit line:col when there is no text to point at. */
  readonly lineCol?: string;
}

const rule = (body: string) => edit(NET, '  quay:\n    rules:\n', `  quay:\n    rules:\n${body}`);

const CASES: Case[] = [
  // whole-file problems
  { name: 'empty file', net: '', says: 'the file is empty', lineCol: '1:1' },
  { name: 'comments only', net: '# nothing here\n', says: 'the file is empty' },
  { name: 'a list at the top', net: '- quay\n- mill\n', says: 'expected a mapping of keys', lineCol: '1:1' },
  { name: 'missing format', net: edit(NET, 'format: bellstep/program-set@1\n', ''), says: 'missing "format: bellstep/program-set@1"' },
  { name: 'wrong format tag', net: edit(NET, 'program-set@1', 'program-set@2'), says: 'expected format "bellstep/program-set@1"', at: 'bellstep/program-set@2' },
  { name: 'a noise model given as NET', net: NOISE, says: 'looks like a noise model: pass it with --noise' },
  { name: 'unknown top-level key', net: edit(NET, 'links:', 'linkz:'), says: 'unknown field "linkz" (did you mean "links"?)', at: 'linkz' },
  { name: '__proto__ key', net: edit(NET, 'title:', '__proto__: {polluted: true}\ntitle:'), says: 'the key "__proto__" is not allowed', at: '__proto__' },
  { name: 'constructor key deep inside', net: edit(NET, '{partner: quay, as: left}', '{partner: quay, as: left, constructor: 1}'), says: 'the key "constructor" is not allowed', at: 'constructor' },
  { name: 'YAML syntax error', net: edit(NET, '{partner: quay, as: left}', '{partner: quay, as: left'), says: 'YAML' },
  { name: 'duplicate key', net: edit(NET, 'title: one swap', 'title: x\ntitle: one swap'), says: 'duplicate key "title"', at: 'title: one swap' },
  // nodes and links
  { name: 'node id with capitals', net: edit(NET, 'id: quay', 'id: Quay'), says: '"Quay" is not a node id', at: 'Quay' },
  { name: 'duplicate node id', net: edit(NET, 'id: ridge', 'id: mill'), says: 'duplicate node id "mill"' },
  { name: 'link to an unknown node', net: edit(NET, 'ends: [quay, mill]', 'ends: [quay, mil]'), says: 'unknown node "mil" (did you mean "mill"?)', at: 'mil]' },
  { name: 'link from a node to itself', net: edit(NET, 'ends: [mill, ridge]', 'ends: [mill, mill]'), says: 'a link joins two different nodes' },
  { name: 'duplicate link', net: edit(NET, 'ends: [mill, ridge]', 'ends: [mill, quay]'), says: 'duplicate link mill~quay' },
  { name: 'qubits below the slots of the links', net: edit(NET, 'qubits: 4', 'qubits: 3'), says: 'node "mill" has 3 qubits but its links reserve 4', at: 'qubits: |3' },
  { name: 'length as a bare number', net: edit(NET, 'length: 12 km', 'length: 12'), says: 'expected a length with a unit such as "12 km", got 12', at: 'length: |12' },
  { name: 'length with an unknown unit', net: edit(NET, 'length: 12 km', 'length: 12 mi'), says: 'expected a length with a unit', at: '12 mi' },
  // programs, rules, guards
  { name: 'program for an unknown node', net: edit(NET, '  quay:\n    rules:', '  qauy:\n    rules:'), says: 'unknown node "qauy" (did you mean "quay"?)', at: 'qauy' },
  { name: 'duplicate rule name', net: rule('      - {name: adopt, when: [{check: true}], do: []}\n'), says: 'duplicate rule name "adopt"' },
  { name: 'rule with no guards', net: rule('      - {name: spin, when: [], do: []}\n'), says: 'a rule needs at least one guard' },
  { name: 'unknown guard kind', net: edit(NET, '- have: {partner: quay, as: left}', '- hvae: {partner: quay, as: left}'), says: 'unknown guard "hvae" (did you mean "have"?)', at: 'hvae' },
  { name: 'two guards in one item', net: rule('      - {name: two, when: [{have: {partner: mill}, check: true}], do: []}\n'), says: 'one guard per list item' },
  { name: 'have without partner or id', net: rule('      - {name: r, when: [{have: {as: p}}], do: []}\n'), says: 'needs "partner"' },
  { name: 'have by id with a count', net: edit(NET, '{id: m.pair, as: p}', '{id: m.pair, as: p, count: 2}'), says: '"count" cannot be used with "id"', at: 'count: 2' },
  { name: 'as names fewer pairs than count', net: edit(NET, '{partner: quay, as: left}', '{partner: quay, as: [a, b], count: 3}'), says: '"as" names 2 pairs but "count" is 3', at: '[a, b]' },
  { name: 'min_age above max_age', net: edit(NET, '{partner: quay, as: left}', '{partner: quay, as: left, min_age: 2 ms, max_age: 1 ms}'), says: 'max_age (1 ms) is less than min_age (2 ms)', at: '1 ms' },
  { name: 'min_age as a bare number', net: edit(NET, '{partner: quay, as: left}', '{partner: quay, as: left, min_age: 40}'), says: 'expected a duration with a unit such as "250 us", got 40', at: '40}' },
  { name: 'a fraction of a nanosecond', net: edit(NET, '{partner: quay, as: left}', '{partner: quay, as: left, max_age: 1.5 ns}'), says: 'not a whole number of nanoseconds', at: '1.5 ns' },
  { name: 'unknown field in a guard', net: edit(NET, '{partner: quay, as: left}', '{partner: quay, as: left, cuont: 2}'), says: 'unknown field "cuont" (did you mean "count"?)', at: 'cuont' },
  { name: 'guard binds a node id', net: edit(NET, '{partner: quay, as: left}', '{partner: quay, as: ridge}'), says: 'may not bind "ridge": that is a node id', at: 'ridge}' },
  // steps
  { name: 'unknown gate op', net: rule('      - {name: g, when: [{have: {partner: mill, as: p}}], do: [{gate: {op: cnto, on: p}}]}\n'), says: '(did you mean "cnot"?)', at: 'cnto' },
  { name: 'cnot on one qubit', net: rule('      - {name: g, when: [{have: {partner: mill, as: p}}], do: [{gate: {op: cnot, on: p}}]}\n'), says: 'cnot acts on two qubits' },
  { name: 'rx without an angle', net: rule('      - {name: g, when: [{have: {partner: mill, as: p}}], do: [{gate: {op: rx, on: p}}]}\n'), says: 'rx needs "angle"' },
  { name: 'h with an angle', net: rule('      - {name: g, when: [{have: {partner: mill, as: p}}], do: [{gate: {op: h, on: p, angle: 1}}]}\n'), says: '"angle" is only for rx, ry and rz', at: 'angle: 1' },
  { name: 'unknown measurement basis', net: rule('      - {name: g, when: [{have: {partner: mill, as: p}}], do: [{measure: {on: p, basis: w}}]}\n'), says: 'expected one of "z", "x" or "y"', at: 'w}' },
  { name: 'Bell-state measurement on one pair twice', net: edit(NET, 'on: [left, right]', 'on: [left, left]'), says: 'needs two different pairs' },
  { name: 'if without then', net: rule('      - {name: g, when: [{have: {partner: mill, as: p}}], do: [{if: "true"}]}\n'), says: 'missing required field "then"' },
  { name: 'send data with a built-in key', net: edit(NET, 'data: {z: zbit', 'data: {from: zbit'), says: '"from" is a built-in field of a message', at: 'from: zbit' },
  { name: 'note with a built-in key', net: rule('      - {name: g, when: [{have: {partner: mill, as: p}}], do: [{note: {pair: p, set: {age: 1}}}]}\n'), says: '"age" is a built-in field of a pair record', at: 'age: 1' },
  { name: 'unknown step kind', net: edit(NET, '- deliver: p', '- delivr: p'), says: 'unknown step "delivr" (did you mean "deliver"?)', at: 'delivr' },
  // names and expressions
  { name: 'name read before it is bound', net: edit(NET, '- got: {from: mill, kind: swapped, as: m}\n          - have: {id: m.pair, as: p}', '- have: {id: m.pair, as: p}\n          - got: {from: mill, kind: swapped, as: m}'), says: '"m" is used before it is bound', at: 'm.pair' },
  { name: 'a pair field naming a message', net: edit(NET, '- deliver: p\n  ridge', '- deliver: m\n  ridge'), says: '"m" is a message', at: 'deliver: |m' },
  { name: 'a pair field naming an unbound pair', net: edit(NET, '- correct: {pair: p,', '- correct: {pair: q,'), says: 'unknown pair "q"' },
  { name: 'debugger function in a program', net: rule('      - {name: g, when: [{check: "fidelity(1) > 0.9"}], do: []}\n'), says: 'fidelity() is a debugger function: it is for breakpoints and expectations', at: 'fidelity(1)' },
  { name: 'unknown function', net: rule('      - {name: g, when: [{check: "maxx(1, 2) > 1"}], do: []}\n'), says: 'unknown function maxx() (did you mean "max"?)', at: 'maxx(' },
  { name: 'expression syntax error', net: rule('      - {name: g, when: [{check: "1 = 2"}], do: []}\n'), says: 'in expression "1 = 2"', at: '= 2' },
  { name: 'broken log template', net: edit(NET, 'bits {zbit}{xbit}', 'bits {zbit +}'), says: 'in expression', at: 'bits {zbit +|}' },
  { name: 'misspelt node in an expression', net: edit(NET, 'far: quay', 'far: qay'), says: 'unknown name "qay" (did you mean "quay"?)', at: 'qay' },
  // roles
  { name: 'a node playing an unknown role', net: edit(NET, '  quay:\n    rules:\n', '  quay:\n    use: [relya]\n    rules:\n'), says: 'unknown role "relya" (at quay)', at: 'relya' },
  { name: 'a role without rules', net: edit(NET, 'programs:', 'roles:\n  relay: {params: [far]}\nprograms:'), says: 'missing required field "rules"', at: '{params' },
  { name: 'a use entry of the wrong shape', net: edit(NET, '  quay:\n    rules:\n', '  quay:\n    use: [{rol: relay}]\n    rules:\n'), says: 'unknown field "rol" (did you mean "role"?)', at: 'rol:' },
  { name: 'a role parameter named like a node id', net: edit(NET, 'programs:', 'roles:\n  relay:\n    params: [ridge]\n    rules: [{name: r, when: [{check: true}], do: []}]\nprograms:'), says: 'parameter "ridge" of role "relay" is named like a node id', at: '[|ridge]' },
  // noise models
  { name: 'noise without a seed', noise: edit(NOISE, 'seed: 20261201\n', ''), says: 'missing required field "seed"', in: 'noise' },
  { name: 'negative seed', noise: edit(NOISE, 'seed: 20261201', 'seed: -4'), says: 'must be at least 0, got -4', at: '-4', in: 'noise' },
  { name: 'probability above 1', noise: edit(NOISE, 'success: 0.02', 'success: 1.02'), says: 'a probability must be between 0 and 1, got 1.02', at: '1.02', in: 'noise' },
  { name: 'Werner fidelity above 1', noise: edit(NOISE, 'werner: 0.95', 'werner: 1.5'), says: 'between 0 and 1, got 1.5', at: '1.5', in: 'noise' },
  { name: 'Bell coefficients not summing to 1', noise: edit(NOISE, '0.92, 0.04', '0.82, 0.04'), says: 'Bell coefficients must sum to 1', at: '[0.82', in: 'noise' },
  { name: 'negative Bell coefficient', noise: edit(NOISE, '0.03, 0.01]', '0.06, -0.02]'), says: 'Bell coefficients cannot be negative', at: '-0.02', in: 'noise' },
  { name: 'T2 above 2·T1', noise: edit(NOISE, '{t1: 10 s, t2: 1 s}', '{t1: 10 ms, t2: 1 s}'), says: 'T2 cannot exceed 2·T1', at: '1 s}', in: 'noise' },
  { name: 'single-click without bright_state', noise: edit(NOISE, 'scheme: double-click', 'scheme: single-click'), says: 'single-click heralding needs "bright_state"', in: 'noise' },
  { name: 'double-click with bright_state', noise: edit(NOISE, 'detector_efficiency: 0.9', 'detector_efficiency: 0.9\n      bright_state: 0.1'), says: '"bright_state" is only for single-click', at: 'bright_state', in: 'noise' },
  { name: 'duration without a unit in the noise model', noise: edit(NOISE, 'by: 5 ms', 'by: 5'), says: 'expected a duration with a unit such as "250 us", got 5', in: 'noise' },
  { name: 'unsorted link key', noise: edit(NOISE, 'mill~ridge:', 'ridge~mill:'), says: 'should be "mill~ridge"', at: 'ridge~mill', in: 'noise' },
  { name: 'noise for a link the network lacks', noise: edit(NOISE, 'mill~ridge:', 'mill~weir:'), says: 'unknown link "mill~weir"', at: 'mill~weir', in: 'noise' },
  { name: 'fault naming an unknown node', noise: edit(NOISE, 'to: ridge', 'to: ridgee'), says: 'unknown node "ridgee" (did you mean "ridge"?)', at: 'ridgee', in: 'noise' },
  { name: 'drop fault with nth 0', noise: edit(NOISE, '- delay: {from: mill, to: ridge, kind: bits, by: 5 ms}', '- drop: {kind: bits, nth: 0}'), says: 'must be at least 1, got 0', at: '0}', in: 'noise' },
  { name: 'unknown fault kind', noise: edit(NOISE, '- delay:', '- dleay:'), says: 'unknown fault "dleay" (did you mean "delay"?)', at: 'dleay', in: 'noise' },
  { name: 'unknown noise key', noise: edit(NOISE, 'defaults:', 'default:'), says: 'unknown field "default" (did you mean "defaults"?)', at: 'default:', in: 'noise' },
  { name: 'a program set given as --noise', noise: NET, says: 'looks like a program set', in: 'noise' },
  // CLI misuse
  { name: 'no NET argument', argv: ['check'], says: "missing required argument 'NET.yaml'" },
  { name: 'unknown option', argv: ['check', 'net.yaml', '--nosie', 'noise.yaml'], says: "unknown option '--nosie'" },
  { name: '--noise without a value', argv: ['check', 'net.yaml', '--noise'], says: "argument missing" },
  { name: 'NET file that does not exist', argv: ['check', 'nowhere.net.yaml'], says: 'nowhere.net.yaml: cannot read the program set: no such file' },
  { name: 'noise file that does not exist', argv: ['check', 'net.yaml', '--noise', 'nowhere.noise.yaml'], says: 'nowhere.noise.yaml: cannot read the noise model: no such file' },
];

describe('malformed inputs through bellstep check', () => {
  it('has a corpus of at least 30 cases', () => {
    expect(CASES.length).toBeGreaterThanOrEqual(30);
  });

  it.each(CASES)('$name', async (c) => {
    const net = c.net ?? NET;
    const files: Record<string, string> = { 'net.yaml': net };
    if (c.noise !== undefined) files['noise.yaml'] = c.noise;
    const argv = c.argv ?? (c.noise !== undefined ? ['check', 'net.yaml', '--noise', 'noise.yaml'] : ['check', 'net.yaml']);
    const r = await runCli(argv, files);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(c.says);
    expect(r.stderr).not.toMatch(/^ {4}at /m);
    expect(r.stdout).toBe('');
    const file = c.in === 'noise' ? 'noise.yaml' : 'net.yaml';
    if (c.at !== undefined) {
      const mark = Math.max(0, c.at.indexOf('|'));
      const { line, col } = where(c.in === 'noise' ? (c.noise as string) : net, c.at.replace('|', ''));
      expect(r.stderr).toContain(`${file}:${line}:${col + mark}:`);
    }
    if (c.lineCol !== undefined) expect(r.stderr).toContain(`${file}:${c.lineCol}:`);
  });
});
