/**
 * Where a person reads about a rule a role made, they read which role's rule it is and at
 * which node: `check` findings, run-time program errors, stall reports. The JSON Schema
 * describes roles for editors, and no edit of a roles file crashes the loader.
 */
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { InputError, InputErrors } from '../../src/model/errors.js';
import { programSetJsonSchema } from '../../src/model/json-schema.js';
import { loadInputs } from '../../src/model/load-inputs.js';
import type { RunSummary } from '../../src/session/summary.js';
import { runCli } from '../helpers/run-cli.js';
import { fixture, where } from './helpers.js';
import { validateJson } from './mini-json-schema.js';

const ROLES = fixture('roles-chain.net.yaml');
const TWIN = fixture('roles-chain-expanded.net.yaml');
const NOISE = 'format: bellstep/noise@1\nseed: 3\ndefaults:\n  link: {pair: {werner: 0.95}, success: 0.3}\n';

function edit(text: string, from: string, to: string, all = false): string {
  if (!text.includes(from)) throw new Error(`edit: "${from}" not found`);
  return all ? text.split(from).join(to) : text.replace(from, to);
}

function cli(args: string[], net: string) {
  return runCli([...args.slice(0, 1), 'net.yaml', '--noise', 'n.yaml', ...args.slice(1)], { 'net.yaml': net, 'n.yaml': NOISE });
}

describe('check on a program set with roles', () => {
  // a misspelt kind in the role: every node that plays it sends "swaped" to its left
  const net = edit(ROLES, 'send: {to: left, kind: swapped', 'send: {to: left, kind: swaped');

  it('analyses the expanded rules and names the role’s rule and the node in each finding', async () => {
    const r = await cli(['check', '--json'], net);
    expect(r.code).toBe(1);
    const findings = JSON.parse(r.stdout).findings as { code: string; line: number; col: number; message: string }[];
    // only ford is left without a "swapped" sender; pier still gets them from mid-way's right
    const typo = findings.filter((f) => f.code === 'message-typo');
    expect(typo).toHaveLength(1);
    expect(typo[0].message).toContain(`ford waits for message kind "swapped" in rule "take" (line ${where(net, '- name: take').line}) from roles.taker.rules[0] (at ford)`);
    expect([typo[0].line, typo[0].col]).toEqual([where(net, 'got: {kind: swapped').line, where(net, 'got: {kind: swapped').col]);
    // oak's misspelt send reaches mid-way, which waits for "swapped": one finding for oak, at the role's line
    const unawaited = findings.filter((f) => f.code === 'message-unawaited');
    expect(unawaited.map((f) => f.message)).toEqual([
      `oak sends message kind "swaped" to mid-way in rule "swap" (line ${where(net, '- name: swap').line}) from roles.repeater.rules[0] (at oak, left='mid-way' right=pier tag='low' limit=40000000), but no rule at mid-way waits for it`,
    ]);
    expect(unawaited[0].line).toBe(where(net, 'kind: swaped').line);
    expect(findings.some((f) => f.message.includes('(at pier'))).toBe(false);
  });

  it('finds nothing in the fixture and its twin', async () => {
    for (const text of [ROLES, TWIN]) {
      const r = await cli(['check'], text);
      expect(r.stdout).toContain('no findings');
      expect(r.code).toBe(0);
    }
  });
});

describe('program errors at run time', () => {
  it('point at the role’s text and name the node and its values', async () => {
    const net = edit(ROLES, 'args: {far: pier}', 'args: {far: 3}');
    const r = await cli(['run', '--until', '10ms'], net);
    expect(r.code).toBe(2);
    const at = where(net, 'partner: far');
    expect(r.stderr).toContain(`net.yaml:${at.line}:${at.col + 'partner: '.length}: ford.hand-over from roles.terminal.rules[0] (at ford, far=3): "3" gave 3, which is not a node id`);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('point at the parameter as written when its value made the expression fail', async () => {
    const net = edit(ROLES, 'joined {left} and {right}', 'joined {left} and {right.side}');
    const r = await cli(['run', '--until', '10ms'], net);
    expect(r.code).toBe(2);
    const at = where(net, 'right.side}');
    // the text shown is the one with the value in place; the column is that of "right" in the file
    expect(r.stderr).toContain(`net.yaml:${at.line}:${at.col}: oak.swap from roles.repeater.rules[0] (at oak, left='mid-way' right=pier tag='low' limit=40000000): `);
    expect(r.stderr).toContain(`in "{'low'}: joined {'mid-way'} and {pier.side}"`);
  });
});

describe('a stalled run of a program set with roles', () => {
  // no swap at hill and oak can ever pass its age check, so the chain fills up and stalls
  const strictRoles = edit(ROLES, 'limit: 40000000', 'limit: 1', true);
  const strictTwin = edit(TWIN, 'age(a) < 40000000 && age(b) < 40000000', 'age(a) < 1 && age(b) < 1', true);

  it('adds "from" to each waiting rule a role made, and is otherwise the twin’s report', async () => {
    const a = JSON.parse((await cli(['run', '--json'], strictRoles)).stdout) as RunSummary;
    const b = JSON.parse((await cli(['run', '--json'], strictTwin)).stdout) as RunSummary;
    expect(a.stop.reason).toBe('stall');
    const hill = a.stall!.hill.find((e) => e.rule === 'swap')!;
    expect(hill.from).toBe("roles.repeater.rules[0] (at hill, left=ford right='mid-way' tag='low' limit=1)");
    expect(hill.reason).toContain('check "age(a) < 1 && age(b) < 1" is false');
    expect(Object.keys(hill)).toEqual(['rule', 'guard', 'kind', 'text', 'reason', 'from']);
    const pierOwn = a.stall!.pier.find((e) => e.rule === 'hand-over')!;
    expect(pierOwn).not.toHaveProperty('from');
    // without the added key, every entry is the twin's, and the rest of the summary too
    const stripped = Object.fromEntries(Object.entries(a.stall!).map(([n, es]) => [n, es.map(({ from: _f, ...rest }) => rest)]));
    expect(stripped).toEqual(b.stall);
    expect(JSON.stringify({ ...a, stall: null })).toBe(JSON.stringify({ ...b, stall: null }));
  });

  it('names the role’s rule and the node in the text report', async () => {
    const r = await cli(['run'], strictRoles);
    expect(r.code).toBe(1);
    expect(r.stdout).toContain(`  hill.swap from roles.repeater.rules[0] (at hill, left=ford right='mid-way' tag='low' limit=1): check "age(a) < 1 && age(b) < 1" is false`);
    expect(r.stdout).toMatch(/\n {2}pier\.hand-over: waits for/);
  });
});

describe('the JSON Schema of a program set', () => {
  const schema = programSetJsonSchema();

  it('accepts a program set with roles and describes roles for editors', () => {
    expect(validateJson(schema, parse(ROLES))).toEqual([]);
    const text = JSON.stringify(schema);
    for (const key of ['roles', 'params', 'use', 'role', 'args']) expect(text).toContain(`"${key}":`);
    expect(text).toContain('Names that the rules may use like node ids');
  });

  it('rejects a use entry of the wrong shape and a role without rules', () => {
    const data = parse(ROLES) as { programs: Record<string, { use: unknown[] }>; roles: Record<string, unknown> };
    data.programs.ford.use = [{ role: 'terminal', argz: { far: 'pier' } }];
    expect(validateJson(schema, data).join('\n')).toContain('/programs/ford/use/0');
    const noRules = parse(ROLES) as { roles: Record<string, unknown> };
    noRules.roles.taker = { params: [] };
    expect(validateJson(schema, noRules)).not.toEqual([]);
  });
});

describe('loading edited roles', () => {
  it('never crashes on a roles program set edited line by line', () => {
    const lines = ROLES.split('\n');
    const variants: string[] = [];
    lines.forEach((line, i) => {
      variants.push([...lines.slice(0, i), ...lines.slice(i + 1)].join('\n'));
      const colon = line.indexOf(': ');
      if (colon < 0) return;
      for (const r of ['', '[]', '{}', '7', '-1', 'true', 'null', '"x"', '[a, b]', '{a: 1}', 'ford', "\"'q'\""]) {
        variants.push([...lines.slice(0, i), `${line.slice(0, colon + 2)}${r}`, ...lines.slice(i + 1)].join('\n'));
      }
    });
    let refused = 0;
    for (const text of variants) {
      try {
        loadInputs({ netFile: 'n.yaml', netText: text });
      } catch (e) {
        const errors = e instanceof InputErrors ? e.errors : e instanceof InputError ? [e] : undefined;
        if (!errors) throw e;
        for (const err of errors) {
          expect(err.line, err.format()).toBeGreaterThanOrEqual(1);
          expect(err.message).not.toMatch(/Invalid input|received undefined/);
        }
        refused++;
      }
    }
    expect(refused).toBeGreaterThan(variants.length / 2);
  });
});
