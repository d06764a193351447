/**
 * Every JUnit report bellstep writes (replay --verify, sweep, merge) validates against the
 * Apache Ant JUnit schema in ../shared/ref/JUnit.xsd, and says what CI needs: one failing
 * case per signature with its seeds and replay names, and one passing case for the rest.
 */
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { validateXML } from 'xmllint-wasm';
import { beforeAll, describe, expect, it } from 'vitest';
import { junitTimestamp, junitXml, xmlAttr, xmlText } from '../../src/report/junit.js';
import { sha256 } from '../../src/session/replay.js';
import { resignV2 } from '../../src/session/replay-v2.js';
import { runCli, type CliResult } from '../helpers/run-cli.js';
import { LOOPING_NET, LOSSY_NET, LOSSY_NOISE } from '../sweep/scenarios.js';

const XSD_PATH = resolve(import.meta.dirname, '../../../shared/ref/JUnit.xsd');
const HAS_XSD = existsSync(XSD_PATH);
if (!HAS_XSD) console.warn(`skipping JUnit schema validation: ${XSD_PATH} is absent (it comes with ../shared beside the project)`);

async function schemaErrors(xml: string): Promise<string[]> {
  const r = await validateXML({ xml: [{ fileName: 'report.xml', contents: xml }], schema: [{ fileName: 'JUnit.xsd', contents: readFileSync(XSD_PATH, 'utf8') }] });
  return r.errors.map((e) => e.rawMessage);
}

const files = { 'lossy.net.yaml': LOSSY_NET, 'lossy.noise.yaml': LOSSY_NOISE, 'loop.net.yaml': LOOPING_NET };
let sweep: CliResult;
let looping: CliResult;
beforeAll(async () => {
  sweep = await runCli(['sweep', 'lossy.net.yaml', '--noise', 'lossy.noise.yaml', '--until', '3ms', '--seeds', '1..8', '--workers', '2', '--save-failures', 'fail', '--expect', 'delivered() >= 0', '--junit', 'sweep.xml', '--json'], files);
  looping = await runCli(['sweep', 'loop.net.yaml', '--seeds', '1..2', '--workers', '1', '--junit', 'loop.xml', '--json'], files);
});

function cases(xml: string): { name: string; body: string }[] {
  return [...xml.matchAll(/<testcase name="([^"]*)"[^>]*?(?:\/>|>([\s\S]*?)<\/testcase>)/g)].map((m) => ({ name: m[1], body: m[2] ?? '' }));
}

describe('JUnit reports', () => {
  it.skipIf(!HAS_XSD)('of a sweep validate, with one failing case per signature and one passing case', async () => {
    const xml = sweep.files.get('sweep.xml')!;
    expect(await schemaErrors(xml)).toEqual([]);
    const rep = JSON.parse(sweep.stdout);
    const cs = cases(xml);
    expect(cs).toHaveLength(rep.failures.length + 1);
    const [fail] = rep.failures;
    const failing = cs.find((c) => c.body.includes('<failure'))!;
    expect(failing.body).toContain(`type="stall"`);
    expect(failing.body).toContain(`seeds (${fail.count}): ${fail.seeds.join(', ')}`);
    expect(failing.body).toContain(`${fail.seeds.map((s: number) => `seed-${s}.replay.json`).join(', ')}`);
    for (const s of fail.seeds) expect(sweep.files.has(`fail/seed-${s}.replay.json`)).toBe(true);
    const passed = rep.runs.filter((r: { outcome: string }) => r.outcome === 'ok').length;
    expect(cs.find((c) => c.name === `${passed} of 8 seeds passed`)?.body).toBe('');
    expect(xml).toMatch(/<testsuite name="bellstep sweep 1\.\.8" tests="2" failures="1" errors="0" time="[0-9.]+" timestamp="\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d" hostname="[^"]+" package="bellstep.sweep" id="0">/);
  });

  it.skipIf(!HAS_XSD)('of a sweep whose program errs validate, with an error element', async () => {
    const xml = looping.files.get('loop.xml')!;
    expect(await schemaErrors(xml)).toEqual([]);
    expect(xml).toContain('<error message="The program stops with an error at run time, at kiln.spin');
    expect(xml).toContain('errors="1"');
  });

  it.skipIf(!HAS_XSD)('of a merge validate', async () => {
    const m = await runCli(['merge', 'whole.json', '--junit', 'merged.xml'], { 'whole.json': sweep.stdout });
    expect(m.code).toBe(1);
    const xml = m.files.get('merged.xml')!;
    expect(await schemaErrors(xml)).toEqual([]);
    expect(xml).toContain('merged from 1 file');
    expect(xml).toContain('(in the --save-failures folder of the job that ran each seed)');
  });

  it.skipIf(!HAS_XSD)('of replay --verify validate, passing and diverged', async () => {
    const replayText = sweep.files.get(`fail/seed-${JSON.parse(sweep.stdout).failures[0].seeds[0]}.replay.json`)!;
    const ok = await runCli(['replay', 'r.json', '--verify', '--junit', 'ok.xml'], { 'r.json': replayText });
    expect(ok.code).toBe(0);
    expect(await schemaErrors(ok.files.get('ok.xml')!)).toEqual([]);
    expect(cases(ok.files.get('ok.xml')!).map((c) => c.name)).toEqual([expect.stringMatching(/^verify: (\d+) of \1 events match the recording$/), 'delivered() &gt;= 0']);
    // the same replay run on another noise model diverges
    const inputs = JSON.parse(replayText).inputs;
    const other = LOSSY_NOISE.replace('loss: 0.02', 'loss: 0.5');
    const forged = resignV2(replayText.replace(/\n {2}"inputs": .*?(,?)(?=\n)/, (_m, comma: string) => `\n  "inputs": ${JSON.stringify({ ...inputs, noise: { ...inputs.noise, text: other, sha256: sha256(other) } })}${comma}`));
    const bad = await runCli(['replay', 'r.json', '--verify', '--junit', 'bad.xml'], { 'r.json': forged });
    expect(bad.code).toBe(1);
    const xml = bad.files.get('bad.xml')!;
    expect(await schemaErrors(xml)).toEqual([]);
    expect(xml).toMatch(/<failure message="event \d+: [^"]*" type="divergence">/);
  });

  it.skipIf(!HAS_XSD)('escape any text, control characters included, and still validate', async () => {
    const nasty = `a < b && c > "d" 'e' \u0001\u0007 tab\tline\nbreak ]]> \uD800 end`;
    const xml = junitXml([
      {
        name: nasty,
        package: nasty,
        seconds: 1.5,
        timestamp: new Date(2026, 11, 2, 10, 0, 0),
        hostname: '  ',
        properties: [[nasty, nasty], ['', 'dropped: a property needs a name']],
        cases: [
          { name: nasty, classname: nasty, seconds: 0.25, failure: { type: nasty, message: nasty, text: nasty } },
          { name: '', classname: '', seconds: -1, error: { type: '', message: nasty, text: nasty } },
        ],
        systemOut: nasty,
        systemErr: nasty,
      },
    ]);
    expect(await schemaErrors(xml)).toEqual([]);
    expect(xml).toContain('timestamp="2026-12-02T10:00:00"');
    expect(xml).toContain('hostname="localhost"');
    expect(xml).not.toContain('\u0001');
    expect(xml).not.toContain('dropped: a property');
  });

  it('escape the five XML characters and keep newlines in attributes', () => {
    expect(xmlText('a<b>&c')).toBe('a&lt;b&gt;&amp;c');
    expect(xmlAttr(`"x" 'y'\nz\t`)).toBe('&quot;x&quot; &apos;y&apos;&#10;z&#9;');
    expect(xmlText('bell\u0007')).toBe('bell\\u0007');
    expect(junitTimestamp(new Date(2026, 0, 5, 7, 8, 9))).toBe('2026-01-05T07:08:09');
  });
});
