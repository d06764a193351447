/**
 * Roles (docs/format.md, "Roles"): a program set written with roles loads into the rules a
 * person would have written out node by node, runs exactly as that twin does, and every
 * mistake in roles is an input error naming the line, the role and the node.
 */
import { describe, expect, it } from 'vitest';
import { Engine, guardText } from '../../src/engine/index.js';
import { loadInputs } from '../../src/model/load-inputs.js';
import type { ProgramSet } from '../../src/model/types.js';
import { Recorder, parseReplay } from '../../src/session/replay.js';
import { RECENT, resignV2 } from '../../src/session/replay-v2.js';
import { runHeadless } from '../../src/session/run.js';
import { fixture, inputErrors, where } from './helpers.js';

const ROLES = fixture('roles-chain.net.yaml');
const TWIN = fixture('roles-chain-expanded.net.yaml');
const NOISE = `format: bellstep/noise@1
seed: 23
defaults:
  link: {pair: {werner: 0.96}, success: 0.2}
  memory: {t1: 4 s, t2: 600 ms}
  gates:
    single: {depolarizing: 0.0005, duration: 1 us}
    two: {depolarizing: 0.003, duration: 30 us}
    measure: {flip: 0.004, duration: 6 us}
`;

function load(net: string, file = 'chain.net.yaml'): { programSet: ProgramSet; engine: Engine } {
  const { programSet, noise } = loadInputs({ netFile: file, netText: net, noiseFile: 'chain.noise.yaml', noiseText: NOISE });
  return { programSet, engine: new Engine(programSet, noise) };
}

/** The text with `from` replaced by `to`; fails loudly when `from` is not there. */
function edit(text: string, from: string, to: string): string {
  if (!text.includes(from)) throw new Error(`edit: "${from}" not found`);
  return text.replace(from, to);
}

/** A run of 40 ms with a recording; returns the summary's JSON text and the replay object. */
function recorded(net: string, file: string): { summary: string; replay: Record<string, unknown>; text: string } {
  const { engine } = load(net, file);
  const rec = new Recorder(engine, { seed: 23, breakpoints: [], expectations: [] });
  const r = runHeadless(engine, { seed: 23, untilNs: 40_000_000, onEvent: (ev, w) => rec.add(ev, w) });
  const text = rec.finish(r.stop);
  return { summary: JSON.stringify(r.summary, null, 2), replay: JSON.parse(text) as Record<string, unknown>, text };
}

describe('expanding roles', () => {
  const { programSet } = load(ROLES);
  const twin = load(TWIN).programSet;

  it('gives each node its roles’ rules first, in use order, then its own, under their plain names', () => {
    const names = (node: string) => programSet.programs[node].rules.map((r) => r.name);
    expect(names('mid-way')).toEqual(['take', 'swap']);
    expect(names('pier')).toEqual(['take', 'hand-over']);
    expect(programSet.programs.pier.rules.map((r) => r.index)).toEqual([0, 1]);
    for (const node of Object.keys(twin.programs)) expect(names(node)).toEqual(twin.programs[node].rules.map((r) => r.name));
  });

  it('puts the values into every expression, so each guard reads as the hand-written one', () => {
    for (const node of Object.keys(twin.programs)) {
      const mine = programSet.programs[node].rules.map((r) => r.when.map(guardText));
      expect(mine).toEqual(twin.programs[node].rules.map((r) => r.when.map(guardText)));
    }
    const swap = programSet.programs.hill.rules[0];
    // a node id with a dash is a string in expressions, as a person would write it
    expect(guardText(swap.when[1])).toBe("have partner 'mid-way', stage link as b");
    expect(guardText(swap.when[2])).toBe('check age(a) < 40000000 && age(b) < 40000000');
  });

  it('keeps where each rule came from: the role’s rule and line, the node and the values', () => {
    const swap = programSet.programs['mid-way'].rules[1];
    expect(swap.from?.text).toBe("roles.repeater.rules[0] (at mid-way, left=ford right=pier tag='high' limit=60000000)");
    expect(swap.from?.role).toBe('repeater');
    expect(swap.from?.node).toBe('mid-way');
    expect(swap.pos.line).toBe(where(ROLES, '- name: swap').line);
    expect(swap.from?.usePos.line).toBe(where(ROLES, '{role: repeater, args: {left: ford, right: pier').line);
    expect(programSet.programs.ford.rules[0].from?.text).toBe('roles.taker.rules[0] (at ford)');
    // the node's own rule has no origin, and its position is its own
    const own = programSet.programs.pier.rules[1];
    expect(own.from).toBeUndefined();
    expect(own.pos.line).toBe(where(ROLES, '- name: hand-over', where(ROLES, '  pier:').line).line);
  });
});

describe('a program set with roles and its hand-expanded twin', () => {
  const a = recorded(ROLES, 'roles-chain.net.yaml');
  const b = recorded(TWIN, 'roles-chain-expanded.net.yaml');

  it('give byte-identical run summaries, with role rules firing and pairs delivered', () => {
    expect(a.summary).toBe(b.summary);
    const s = JSON.parse(a.summary);
    expect(s.delivered.length).toBeGreaterThan(20);
    expect(s.fired['mid-way'].swap).toBeGreaterThan(20);
    expect(s.fired.hill.swap).toBeGreaterThan(20);
  });

  it('give replays that differ in their inputs and in nothing else', () => {
    const events = parseReplay(a.text).events;
    expect(events.length).toBeGreaterThan(500);
    expect(a.replay.inputs).not.toEqual(b.replay.inputs);
    // event one-liners name rules plainly, as the twin's do (the file keeps the last ones' text)
    const last = Array.from({ length: RECENT }, (_, k) => events.summary(events.length - 1 - k));
    expect(last.some((t) => t?.includes('fired mid-way.swap'))).toBe(true);
    for (const key of Object.keys(a.replay)) {
      if (key !== 'inputs' && key !== 'checksum') expect(a.replay[key], key).toEqual(b.replay[key]);
    }
    // the checksum covers the inputs; with the twin's inputs in place the file is the twin's, byte for byte
    const swapped = a.text.replace(/\n {2}"inputs": .*?(,?)(?=\n)/, (_m, comma: string) => `\n  "inputs": ${JSON.stringify(b.replay.inputs)}${comma}`);
    expect(resignV2(swapped)).toBe(b.text);
  });

  it('reads the values: a different limit gives a different run', () => {
    const strict = recorded(edit(ROLES, "{left: ford, right: mid-way, tag: \"'low'\", limit: 40000000}", "{left: ford, right: mid-way, tag: \"'low'\", limit: 1}"), 'x.net.yaml');
    expect(JSON.parse(strict.summary).fired.hill.swap).toBe(0);
    expect(JSON.parse(a.summary).fired.hill.swap).toBeGreaterThan(0);
  });
});

/** The one input error `net` gives, located in `net`. */
function onlyError(net: string) {
  const errors = inputErrors(() => load(net));
  expect(errors.map((e) => e.format())).toHaveLength(1);
  return errors[0];
}

describe('mistakes in roles are input errors naming the line, the role and the node', () => {
  const HILL_ARGS = "{left: ford, right: mid-way, tag: \"'low'\", limit: 40000000}";

  it('a parameter with no value', () => {
    const net = edit(ROLES, HILL_ARGS, "{left: ford, tag: \"'low'\", limit: 40000000}");
    const e = onlyError(net);
    expect(e.message).toContain('role "repeater" at hill needs a value for parameter "right"');
    expect(e.line).toBe(where(net, '{left: ford, tag:').line);
    expect(e.field).toBe('programs.hill.use[0].args');
    expect(e.fix).toContain('right: ...');
  });

  it('a role with parameters named alone', () => {
    const net = edit(ROLES, '    use: [taker, {role: terminal, args: {far: pier}}]', '    use: [taker, terminal]');
    const e = onlyError(net);
    expect(e.message).toContain('role "terminal" at ford needs a value for parameter "far"');
    expect(e.field).toBe('programs.ford.use[1]');
    expect([e.line, e.col]).toEqual([where(net, 'terminal]').line, where(net, 'terminal]').col]);
  });

  it('an unknown parameter', () => {
    const net = edit(ROLES, HILL_ARGS, "{left: ford, right: mid-way, tag: \"'low'\", limit: 40000000, middle: oak}");
    const e = onlyError(net);
    expect(e.message).toBe('role "repeater" has no parameter "middle" (at hill)');
    expect(e.fix).toBe('its parameters are "left", "right", "tag" and "limit"');
    expect([e.line, e.col]).toEqual([where(net, 'middle: oak').line, where(net, 'middle: oak').col]);
  });

  it('a misspelt parameter, with the nearest name suggested (and not also called missing)', () => {
    const net = edit(ROLES, HILL_ARGS, "{left: ford, rigth: mid-way, tag: \"'low'\", limit: 40000000}");
    const e = onlyError(net);
    expect(e.message).toBe('role "repeater" has no parameter "rigth" (did you mean "right"?) (at hill)');
    expect(e.field).toBe('programs.hill.use[0].args.rigth');
    expect(e.line).toBe(where(net, 'rigth').line);
  });

  it('a parameter given twice', () => {
    const net = edit(ROLES, HILL_ARGS, "{left: ford, right: mid-way, tag: \"'low'\", limit: 40000000, left: oak}");
    const e = onlyError(net);
    expect(e.message).toBe('parameter "left" is given twice to role "repeater" at hill');
    expect(e.field).toBe('programs.hill.use[0].args.left');
    expect([e.line, e.col]).toEqual([where(net, 'left: oak').line, where(net, 'left: oak').col]);
  });

  it('a parameter named like a node id', () => {
    const net = edit(edit(ROLES, 'params: [far]', 'params: [oak]'), 'have: {partner: far, as: p}', 'have: {partner: oak, as: p}');
    const errors = inputErrors(() => load(net));
    expect(errors[0].message).toBe('parameter "oak" of role "terminal" is named like a node id (played by ford), so "oak" in its rules could mean either');
    expect(errors[0].field).toBe('roles.terminal.params[0]');
    expect(errors[0].line).toBe(where(net, 'params: [oak]').line);
    // the node's args are not checked against a parameter list that is itself wrong
    expect(errors.every((e) => !e.message.includes('no parameter "far"'))).toBe(true);
  });

  it('a parameter bound again by a guard', () => {
    const net = edit(ROLES, '          - have: {partner: right, as: b}', '          - have: {partner: right, as: tag}');
    const errors = inputErrors(() => load(net));
    const e = errors.find((x) => x.message.includes('may not bind'))!;
    expect(e.message).toBe('the have guard may not bind "tag": it is a parameter of role "repeater" (played by hill, mid-way, oak), so it already stands for a node');
    expect(e.field).toBe('roles.repeater.rules[0].when[1]');
    expect([e.line, e.col]).toEqual([where(net, 'as: tag}').line, where(net, 'as: tag}').col + 4]);
  });

  it('an unknown role, with the nearest name suggested', () => {
    const net = edit(ROLES, '    use: [taker, {role: terminal', '    use: [taker, {role: terminl');
    const e = onlyError(net);
    expect(e.message).toBe('unknown role "terminl" (did you mean "terminal"?) (at ford)');
    expect(e.field).toBe('programs.ford.use[1].role');
    expect(e.line).toBe(where(net, 'terminl').line);
  });

  it('a rule name that clashes after expansion names both sources', () => {
    const net = edit(ROLES, '    use: [taker]\n    rules:\n      - name: hand-over', '    use: [taker]\n    rules:\n      - name: take');
    const e = onlyError(net);
    const ownLine = where(net, '      - name: take', where(net, '  pier:').line).line;
    const roleLine = where(net, '      - name: take').line;
    expect(e.message).toBe(`at pier, rule name "take" of its own rules (line ${ownLine}) clashes with "take" from roles.taker.rules[0] (at pier), line ${roleLine}`);
    expect(e.field).toBe('programs.pier.rules[0].name');
    expect(e.line).toBe(ownLine);
  });

  it('two roles whose rule names clash at a node', () => {
    const net = edit(ROLES, '    use: [taker]\n    rules:', '    use: [taker, {role: terminal, args: {far: ford}}]\n    rules:');
    const e = onlyError(net);
    expect(e.message).toMatch(/^at pier, rule name "hand-over" of its own rules \(line \d+\) clashes with "hand-over" from roles\.terminal\.rules\[0\] \(at pier, far=ford\), line \d+$/);
    const twice = onlyError(edit(ROLES, '    use: [taker]\n', '    use: [taker, taker]\n'));
    expect(twice.message).toMatch(/^pier plays role "taker" twice \(first at line \d+\)/);
    expect(twice.field).toBe('programs.pier.use[1]');
  });

  it('a value that is not a node id, a number or a quoted string', () => {
    const net = edit(ROLES, 'args: {far: pier}', 'args: {far: peir}');
    const e = onlyError(net);
    expect(e.message).toBe('parameter "far" of role "terminal" at ford: unknown node "peir" (did you mean "pier"?)');
    expect(e.field).toBe('programs.ford.use[1].args.far');
    const bool = onlyError(edit(ROLES, 'args: {far: pier}', 'args: {far: true}'));
    expect(bool.message).toBe('parameter "far" of role "terminal" at ford: expected a node id, a number or a quoted string, got true');
  });

  it('an error inside a role’s rule is reported once, at the role’s text, whoever plays it', () => {
    const net = edit(ROLES, '"age(a) < limit && age(b) < limit"', '"agee(a) < limit && age(b) < limit"');
    const e = onlyError(net);
    expect(e.message).toContain('unknown function agee()');
    expect(e.field).toBe('roles.repeater.rules[0].when[2].check');
    expect([e.line, e.col]).toEqual([where(net, 'agee(').line, where(net, 'agee(').col]);
  });
});
