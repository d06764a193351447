/**
 * The long-chain demo does what its README says: seventeen sites written as five roles
 * deliver ash~quill pairs at the fidelity the published formulas predict, its cut-offs fire
 * and are told to the far end, and it opens in the debugger.
 */
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { loadInputs } from '../../src/model/load-inputs.js';
import { runCli } from '../helpers/run-cli.js';
import { dejmps, swapBell, werner } from './bell-formulas.js';
import { idealNoise, loadDemo, meanFidelity, noiseNumber, runJson } from './demo-files.js';

const RUN = ['--until', '200ms'];
const demo = loadDemo('long-chain');

type Use = string | { role: string; args?: Record<string, string> };
const programs = (parse(demo.net) as { programs: Record<string, { use?: Use[]; rules?: unknown[] }> }).programs;

/** The value a site gives a role's parameter, read from the file. */
function arg(site: string, role: string, param: string): string | undefined {
  const u = programs[site].use?.find((x): x is Exclude<Use, string> => typeof x !== 'string' && x.role === role);
  return u?.args?.[param];
}

describe('long-chain', () => {
  it('is written with roles: a short file that every site plays roles in', () => {
    expect(demo.net.split('\n').length).toBeLessThanOrEqual(120);
    expect(Object.keys(programs)).toHaveLength(17);
    for (const [site, p] of Object.entries(programs)) {
      expect(p.use?.length, site).toBeGreaterThan(0);
      expect(p.rules, site).toBeUndefined();
    }
    const { programSet } = loadInputs({ netFile: demo.netFile, netText: demo.net });
    const rules = Object.values(programSet.programs).flatMap((p) => p.rules);
    expect(rules.length).toBeGreaterThan(100);
    expect(rules.every((r) => r.from !== undefined)).toBe(true);
  });

  it('delivers only ash~quill pairs, and its cut-offs fire and are told to the far end', async () => {
    const { code, s } = await runJson(demo, [...RUN, '--expect', 'delivered(ash, quill) == delivered()']);
    expect(code).toBe(0);
    expect(s.expectations[0].ok).toBe(true);
    expect(s.delivered.length).toBeGreaterThan(40);
    for (const d of s.delivered) expect(d.ends).toEqual(['ash', 'quill']);
    let cutOffs = 0;
    const toldTo = new Map<string, number>();
    for (const [site, fired] of Object.entries(s.fired)) {
      for (const side of ['left', 'right'] as const) {
        const n = fired[`cut-off-${side}`];
        if (n === undefined) continue;
        cutOffs += n;
        const far = arg(site, 'swapper', side)!;
        toldTo.set(far, (toldTo.get(far) ?? 0) + n);
      }
    }
    expect(cutOffs).toBeGreaterThan(0);
    // every cut-off sends one "expired", and the far end drops its half on each
    for (const [site, fired] of Object.entries(s.fired)) {
      if (fired.expired !== undefined) expect(fired.expired, site).toBe(toldTo.get(site) ?? 0);
    }
  });

  it('delivers the fidelity of sixteen purified links swapped at four levels when gates and memories are ideal', async () => {
    const { s } = await runJson(demo, RUN, { noise: idealNoise(demo.noise) });
    const f = noiseNumber(demo.noise, ['defaults', 'link', 'pair', 'werner']);
    // DEJMPS 1996 on each link, then the Bell-diagonal swap (common practice) at every level
    let pair = dejmps(werner(f)).out;
    for (let level = 0; level < 4; level++) pair = swapBell(pair, pair);
    expect(s.delivered.length).toBeGreaterThan(40);
    for (const d of s.delivered) expect(d.fidelity).toBeCloseTo(pair[0], 9);
    // with the demo noise they are worse, but still entangled (above 1/2, common practice)
    const noisy = (await runJson(demo, RUN)).s;
    expect(meanFidelity(noisy)).toBeLessThan(pair[0]);
    expect(noisy.delivered.every((d) => d.fidelity > 0.5)).toBe(true);
  });

  it('opens with bellstep demo long-chain (which, without a terminal, points to bellstep run)', async () => {
    const r = await runCli(['demo', 'long-chain']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('needs an interactive terminal');
    expect(r.stderr).toMatch(/bellstep run \S*demos\/long-chain\/chain\.net\.yaml --noise \S*demos\/long-chain\/chain\.noise\.yaml/);
  });
});
