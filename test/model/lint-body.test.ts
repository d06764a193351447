/**
 * `check` finds what `run` would refuse: each class of mistake below passed check and then
 * stopped the run with a program error (found by mutating the demos). Each is now a finding
 * at its line with a fix, and each is shown to be real by running it.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { noiseWith, SWAP_NET } from '../engine/scenarios.js';

interface Found {
  code: string;
  line: number;
  message: string;
  fix: string;
}

async function findings(net: string, noise?: string): Promise<Found[]> {
  const files = { 'n.net.yaml': net, ...(noise ? { 'n.noise.yaml': noise } : {}) };
  const r = await runCli(['check', 'n.net.yaml', '--json', ...(noise ? ['--noise', 'n.noise.yaml'] : [])], files);
  expect(r.stderr).toBe('');
  return JSON.parse(r.stdout).findings;
}

/** The run refuses the program with a program error, as the finding said it would. */
async function runRefuses(net: string, says: RegExp, noise?: string): Promise<void> {
  const files = { 'n.net.yaml': net, ...(noise ? { 'n.noise.yaml': noise } : {}) };
  const r = await runCli(['run', 'n.net.yaml', '--until', '50ms', ...(noise ? ['--noise', 'n.noise.yaml'] : [])], files);
  expect(r.code).toBe(2);
  expect(r.stderr).toMatch(says);
}

const lineOf = (text: string, needle: string, nth = 1): number => {
  let at = -1;
  for (let k = 0; k < nth; k++) at = text.indexOf(needle, at + 1);
  return text.slice(0, at).split('\n').length;
};

describe('check finds what run would refuse', () => {
  it('a pair discarded twice in one body', async () => {
    const net = SWAP_NET.replace('          - deliver: p\n  quay:', '          - deliver: p\n          - discard: p\n  quay:');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['pair-released']);
    expect(fs[0].line).toBe(lineOf(net, '- discard: p'));
    expect(fs[0].message).toContain(`acts on pair "p" after it was delivered (line ${lineOf(net, '- deliver: p')})`);
    await runRefuses(net, /ridge\.fix-up: pair "p" was already measured, discarded or delivered/);
  });

  it('a pair used after a branch that measures it on every path, and not after one that may keep it', async () => {
    const both = SWAP_NET.replace('          - deliver: p\n  quay:', '          - if: "m.x == 1"\n            then: [{measure: {on: p}}]\n            else: [{discard: p}]\n          - deliver: p\n  quay:').replace('          - deliver: p\n          - if', '          - if');
    expect((await findings(both)).map((f) => f.code)).toEqual(['pair-released']);
    const one = both.replace('else: [{discard: p}]', 'else: [{log: "kept"}]');
    expect(await findings(one)).toEqual([]);
  });

  it('a message field that no sender of that kind sets, with the nearest', async () => {
    const net = SWAP_NET.replace('correct: {pair: p, x: m.x, z: m.z}', 'correct: {pair: p, x: m.x, z: m.zz}');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['message-field-unknown']);
    expect(fs[0].message).toContain('no sender of "swapped" to ridge sets the field "zz" read in `m`.zz (did you mean "z"?');
    expect(fs[0].fix).toContain('write m.z');
    await runRefuses(net, /no field "zz" in `m`/);
  });

  it('a pair field that no rule notes', async () => {
    const net = SWAP_NET.replace('- rebind: {pair: p, partner: m.peer, id: m.joined}\n          - deliver: p\n  quay', '- rebind: {pair: p, partner: m.peer, id: p.joined}\n          - deliver: p\n  quay');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['pair-field-unknown']);
    expect(fs[0].message).toContain('no rule at ridge notes "joined" on a pair');
    await runRefuses(net, /no field "joined" in `p`/);
  });

  it('a noted field read before the note, or on a pair in a stage that never carries it', async () => {
    const demo = readFileSync('demos/lost-message/lost.net.yaml', 'utf8');
    // start notes the probe's id on keep, then moves keep to "waiting": give-up may read
    // keep.probe there, but start itself may not read it before its note, nor on the probe
    expect(await findings(demo)).toEqual([]);
    const early = demo.replace('          - note: {pair: keep, set: {probe: probe.id}}\n', '').replace('          - stage: {pair: keep, to: waiting}\n', '          - log: "{keep.probe}"\n          - note: {pair: keep, set: {probe: probe.id}}\n          - stage: {pair: keep, to: waiting}\n');
    expect(early).not.toBe(demo);
    const fs = await findings(early);
    expect(fs.map((f) => f.code)).toEqual(['pair-field-unknown']);
    expect(fs[0].message).toContain('pairs bound in stage "link" at vale do not carry "probe" at this point');
    await runRefuses(early, /no field "probe" in `keep`/, readFileSync('demos/lost-message/lost.noise.yaml', 'utf8'));
    const probe = demo.replace('data: {bit: bit, probe: probe.id}', 'data: {bit: bit, probe: probe.probe}');
    expect((await findings(probe)).map((f) => f.code)).toEqual(['pair-field-unknown']);
  });

  it('the field of a literal, a pair where a number or a truth value is needed', async () => {
    const net = SWAP_NET.replace('- have: {id: m.pair, as: p}\n        do:\n          - correct', '- have: {id: false.pair, as: p}\n        do:\n          - correct');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['type-mismatch']);
    expect(fs[0].message).toContain('`false` is true or false, not a record, so it has no field "pair"');
    await runRefuses(net, /`false` is false, not a record/);
    const angle = SWAP_NET.replace('- bell_measure:', '- gate: {op: rx, on: a, angle: b}\n          - bell_measure:');
    expect((await findings(angle))[0].message).toContain('the angle needs a number, but `b` is a pair record');
    await runRefuses(angle, /angle "b" is not a number/);
    const truth = SWAP_NET.replace('- have: {partner: ridge, as: b}', '- have: {partner: ridge, as: b}\n          - check: "b.id"');
    expect((await findings(truth))[0].message).toContain('the check needs true/false (or a bit 0/1), but `b.id` is a pair id');
  });

  it('a pair id or a text that is no node where a node is needed', async () => {
    const net = SWAP_NET.replace("send: {to: quay, kind: swapped, pair: a.id", "send: {to: a.id, kind: swapped, pair: a.id");
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toContain('type-mismatch');
    const f = fs.find((x) => x.code === 'type-mismatch')!;
    expect(f.message).toBe('"to" needs a node id, but `a.id` is a pair id');
    expect(f.fix).toContain('write a.partner');
    await runRefuses(net, /"a\.id" gave "mill~quay#\d+", which is not a node id/);
    const text = SWAP_NET.replace("send: {to: quay, kind: swapped, pair: a.id", "send: {to: \"'quai'\", kind: swapped, pair: a.id");
    expect((await findings(text)).find((x) => x.code === 'type-mismatch')?.message).toBe('"to" needs a node id, but "quai" is not a node of the network');
  });

  it('the kind of a message where a node is needed', async () => {
    // quay's relabel rule, the last rebind of the file
    const at = SWAP_NET.lastIndexOf('partner: m.peer');
    const net = `${SWAP_NET.slice(0, at)}partner: m.kind${SWAP_NET.slice(at + 'partner: m.peer'.length)}`;
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['type-mismatch']);
    expect(fs[0].message).toBe('"partner" needs a node id, but `m.kind` is a message kind, not a node');
    expect(fs[0].fix).toBe("write m.from for the message's sender");
    await runRefuses(net, /"m\.kind" gave "swapped", which is not a node id/);
  });

  it("a message's pair id as an angle, and arithmetic on literals as a condition", async () => {
    const angle = SWAP_NET.replace('correct: {pair: p, x: m.x, z: m.z}', 'gate: {op: rx, on: p, angle: m.pair}');
    expect((await findings(angle)).map((f) => f.message)).toEqual(['the angle needs a number, but `m.pair` is a pair id']);
    await runRefuses(angle, /angle "m\.pair" is not a number/);
    const cond = SWAP_NET.replace('          - deliver: p\n  quay:', '          - if: "-3.14 / 2"\n            then: [{deliver: p}]\n            else: [{discard: p}]\n  quay:');
    expect((await findings(cond)).map((f) => f.message)).toEqual(['the condition of "if" needs true/false (or a bit 0/1), but `-3.14 / 2` is the number -1.57']);
    await runRefuses(cond, /gave -1\.57, not true or false/);
  });

  it('a message field that every sender fills with text, used as a bit', async () => {
    const net = SWAP_NET.replace('data: {z: zb, x: xb, peer: quay', 'data: {z: quay, x: xb, peer: quay');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['type-mismatch']);
    expect(fs[0].message).toBe('"z" needs true/false (or a bit 0/1), but `m.z` is text');
    await runRefuses(net, /"m\.z" gave "quay", not a bit/);
  });

  it('a number other than 0 and 1 as a condition', async () => {
    const net = SWAP_NET.replace('          - deliver: p\n  quay:', '          - if: "2"\n            then: [{deliver: p}]\n            else: [{discard: p}]\n  quay:');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['type-mismatch']);
    expect(fs[0].message).toBe('the condition of "if" needs true/false (or a bit 0/1), but `2` is the number 2');
    await runRefuses(net, /"2" gave 2, not true or false/);
  });

  it('arithmetic on literals that overflows, as an angle', async () => {
    const net = SWAP_NET.replace('- bell_measure:', '- gate: {op: rx, on: a, angle: "1e308 * 10"}\n          - bell_measure:');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['number-overflow']);
    expect(fs[0].message).toBe('`1e308 * 10` is too large a number to hold (it gives Infinity)');
    await runRefuses(net, /angle "1e308 \* 10" gave Infinity, not a finite number of radians/);
  });

  it('a division by zero', async () => {
    const net = SWAP_NET.replace('          - deliver: p\n  quay:', '          - log: "{m.x / 0}"\n          - deliver: p\n  quay:');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toEqual(['division-by-zero']);
    expect(fs[0].message).toBe('`m.x / 0` divides by zero');
    await runRefuses(net, /division by zero in `m\.x \/ 0`/);
  });

  it('a rule that consumes nothing it matches, which loops at once, or for ever when its gates take time', async () => {
    const body = SWAP_NET.slice(SWAP_NET.indexOf('          - bell_measure'), SWAP_NET.indexOf('  ridge:'));
    const net = SWAP_NET.replace(body, '          - gate: {op: h, on: a}\n');
    const fs = await findings(net);
    expect(fs.map((f) => f.code)).toContain('rule-loop');
    const loop = fs.find((f) => f.code === 'rule-loop')!;
    expect(loop.line).toBe(lineOf(net, '- name: swap'));
    expect(loop.message).toContain('once it fires it fires again at once');
    await runRefuses(net, /rule loop: fired more than 1000 times/);
    const slow = noiseWith('{werner: 0.9}', '  gates:\n    single: {duration: 2 us}');
    const busy = (await findings(net, slow)).find((f) => f.code === 'rule-loop')!;
    expect(busy.message).toContain('fires again each time its gates finish, for ever');
  });
});
