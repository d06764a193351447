/** docs/format.md is part of the interface: its roles example loads, runs, and expands as it says. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Engine } from '../src/engine/index.js';
import { loadInputs } from '../src/model/load-inputs.js';
import { runHeadless } from '../src/session/run.js';
import { runCli } from './helpers/run-cli.js';

const doc = readFileSync('docs/format.md', 'utf8');
const roles = doc.slice(doc.indexOf('## Roles'));
const [example, ridgeSwap] = [...roles.matchAll(/```yaml\n([\s\S]*?)```/g)].map((m) => m[1]);
const NOISE = 'format: bellstep/noise@1\nseed: 4\ndefaults:\n  link: {pair: {werner: 0.95}, success: 0.3}\n';

function summary(net: string): string {
  const { programSet, noise } = loadInputs({ netFile: 'doc.net.yaml', netText: net, noiseFile: 'n.yaml', noiseText: NOISE });
  return JSON.stringify(runHeadless(new Engine(programSet, noise), { seed: 4, untilNs: 20_000_000 }).summary);
}

describe('docs/format.md, Roles', () => {
  it('has an example that check accepts with no findings', async () => {
    const r = await runCli(['check', 'doc.net.yaml'], { 'doc.net.yaml': example });
    expect(r.stdout).toContain('no findings');
    expect(r.code).toBe(0);
  });

  it('shows ridge’s swap as the expansion gives it: written out by hand, it runs the same', () => {
    const line = '  ridge: {use: [joiner, {role: repeater, args: {left: quay, right: loft}}]}\n';
    expect(example).toContain(line);
    const byHand = example.replace(line, `  ridge:\n    use: [joiner]\n    rules:\n${ridgeSwap}`);
    const s = summary(example);
    expect(JSON.parse(s).delivered.length).toBeGreaterThan(10);
    expect(summary(byHand)).toBe(s);
  });

  it('quotes the origin of that rule as messages print it', () => {
    const { programSet } = loadInputs({ netFile: 'doc.net.yaml', netText: example });
    const from = programSet.programs.ridge.rules.find((r) => r.name === 'swap')?.from?.text;
    expect(from).toBe('roles.repeater.rules[0] (at ridge, left=quay right=loft)');
    expect(roles).toContain(`\`${from}\``);
  });
});
