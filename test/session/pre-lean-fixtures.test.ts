/**
 * Regression fixtures recorded by the engine before the lean core (commit 65ce577): replay
 * files that must still verify, and for many seeds of several scenarios the last chained
 * digest and the hash of the run summary. Every digest hashes the density matrices bit for
 * bit, so a faster kernel or interpreter that changes any number, any event or any order of
 * operations fails here.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { Engine } from '../../src/engine/index.js';
import { loadInputs } from '../../src/model/index.js';
import { DigestChain, parseReplay, replayChecksum, serializeReplay, type ReplayFileV1 } from '../../src/session/replay.js';
import { runHeadless } from '../../src/session/run.js';
import { verifyReplay } from '../../src/session/verify.js';
import { SCENARIOS, type FixtureScenario } from '../fixtures/pre-lean/scenarios.js';

const here = dirname(fileURLToPath(import.meta.url));
const dir = join(here, '../fixtures/pre-lean');
const root = join(here, '../..');
const table = JSON.parse(readFileSync(join(dir, 'digests.json'), 'utf8')) as Record<string, { seed: number; events: number; last: string; summary: string }[]>;

function engineFor(s: FixtureScenario, seed: number): Engine {
  const netText = s.netText ?? readFileSync(join(root, s.net), 'utf8');
  const noiseText = s.noiseText ?? readFileSync(join(root, s.noise), 'utf8');
  const { programSet, noise } = loadInputs({ netFile: s.net, netText, noiseFile: s.noise, noiseText, seed });
  return new Engine(programSet, noise);
}

describe('replays recorded before the lean core', () => {
  for (const s of SCENARIOS.filter((x) => x.replayEvents)) {
    it(`${s.name}: still verifies, every event and digest`, () => {
      const file = join(dir, `${s.name}.replay.json`);
      const r = parseReplay(readFileSync(file, 'utf8'), file);
      const v = verifyReplay(r);
      expect(v.divergence).toBeNull();
      expect(v.ok).toBe(true);
      expect(v.checked).toBe(r.events.length);
    });
  }
});

describe('tampered @1 files, re-signed', () => {
  const file = join(dir, 'three-site-swap.replay.json');
  const original = JSON.parse(readFileSync(file, 'utf8')) as ReplayFileV1;
  const forge = (edit: (r: ReplayFileV1) => void): ReplayFileV1 => {
    const r = structuredClone(original);
    edit(r);
    r.checksum = replayChecksum(r);
    return r;
  };
  for (const [what, edit] of [
    ['emptied', (r: ReplayFileV1) => (r.events = [])],
    ['halved', (r: ReplayFileV1) => (r.events = r.events.slice(0, r.events.length / 2))],
    ['cut by one event', (r: ReplayFileV1) => void r.events.pop()],
  ] as const) {
    it(`never verifies when ${what}: the run does not stop where the file says`, () => {
      const v = verifyReplay(parseReplay(serializeReplay(forge(edit))));
      expect(v.ok).toBe(false);
      expect(v.divergence?.field).toBe('stop');
      expect(v.divergence?.message).toMatch(/stops at its event limit of 300, but holds \d+ events/);
    });
  }

  it('never verifies with one event removed from the middle', () => {
    const v = verifyReplay(parseReplay(serializeReplay(forge((r) => void r.events.splice(100, 1)))));
    expect(v.ok).toBe(false);
    expect(v.divergence?.index).toBe(100);
  });
});

describe('digests and summaries recorded before the lean core', () => {
  for (const s of SCENARIOS) {
    it(`${s.name}: the same last digest and summary bytes for ${s.seeds.length} seeds`, () => {
      const got = s.seeds.map((seed) => {
        const engine = engineFor(s, seed);
        // the digest of the files of that time (version 1), chained over every event
        const chain = new DigestChain(1);
        let count = 0;
        const r = runHeadless(engine, { seed, maxEvents: s.events, onEvent: (ev, w) => void (chain.advance(ev, w), count++) });
        return {
          seed,
          events: r.summary.events,
          last: count ? chain.hex : '',
          summary: createHash('sha256').update(JSON.stringify(r.summary)).digest('hex'),
        };
      });
      expect(got).toEqual(table[s.name]);
    });
  }
});
