/**
 * The bundled demos as files on disk, and ways to run them through the real CLI, as they
 * are or with one piece changed (an ideal noise model, a rule removed, a pick flipped).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { isMap, isSeq, parseDocument, type Document, type YAMLMap, type YAMLSeq } from 'yaml';
import { runCli, type CliResult } from '../helpers/run-cli.js';
import type { RunSummary } from '../../src/session/summary.js';

/** The demos folder of this checkout. */
export const DEMOS_DIR = fileURLToPath(new URL('../../demos/', import.meta.url));

/** The scenarios the demo command relies on, by folder name. */
export const DEMO_NAMES = ['three-site-swap', 'two-site-purification', 'stalled-purification', 'lost-message', 'nested-repeater', 'long-chain'] as const;

/** One demo folder: its file names and their text. */
export interface Demo {
  readonly name: string;
  readonly files: readonly string[];
  readonly netFile: string;
  readonly noiseFile: string;
  readonly net: string;
  readonly noise: string;
  readonly readme: string;
}

/** Every folder under demos/. */
export function demoFolders(): string[] {
  return readdirSync(DEMOS_DIR, { withFileTypes: true })
    .filter((e) => e.isDirectory())
    .map((e) => e.name)
    .sort();
}

function only(files: readonly string[], suffix: string, name: string): string {
  const hits = files.filter((f) => f.endsWith(suffix));
  if (hits.length !== 1) throw new Error(`demos/${name} has ${hits.length} *${suffix} files: ${hits.join(', ') || 'none'}`);
  return hits[0];
}

/** Reads one demo folder; throws when it does not hold exactly one net and one noise file. */
export function loadDemo(name: string): Demo {
  const dir = `${DEMOS_DIR}${name}/`;
  const files = readdirSync(dir).sort();
  const netFile = only(files, '.net.yaml', name);
  const noiseFile = only(files, '.noise.yaml', name);
  const read = (f: string) => readFileSync(dir + f, 'utf8');
  return { name, files, netFile, noiseFile, net: read(netFile), noise: read(noiseFile), readme: read('README.md') };
}

/** Replacement texts for a run. */
export interface Variant {
  readonly net?: string;
  readonly noise?: string;
}

/** `bellstep <command> NET --noise NOISE ...args` on the demo's files (or a variant of them). */
export function cliOn(demo: Demo, command: 'run' | 'check', args: string[] = [], v: Variant = {}): Promise<CliResult> {
  const net = `demos/${demo.name}/${demo.netFile}`;
  const noise = `demos/${demo.name}/${demo.noiseFile}`;
  return runCli([command, net, '--noise', noise, ...args], { [net]: v.net ?? demo.net, [noise]: v.noise ?? demo.noise });
}

/** A run with `--json`; returns the exit code and the parsed summary. */
export async function runJson(demo: Demo, args: string[], v: Variant = {}): Promise<{ code: number; s: RunSummary; stderr: string }> {
  const r = await cliOn(demo, 'run', [...args, '--json'], v);
  if (!r.stdout.trim().startsWith('{')) throw new Error(`run printed no summary (exit ${r.code}): ${r.stderr}`);
  return { code: r.code, s: JSON.parse(r.stdout) as RunSummary, stderr: r.stderr };
}

/** The demo's noise model without memory decay and gate noise: only the link pairs are noisy. */
export function idealNoise(noiseText: string): string {
  const doc = parseDocument(noiseText);
  doc.deleteIn(['defaults', 'memory']);
  doc.deleteIn(['defaults', 'gates']);
  return doc.toString();
}

/** A number from the noise model, e.g. ['defaults', 'link', 'pair', 'werner']. */
export function noiseNumber(noiseText: string, path: string[]): number {
  const v = parseDocument(noiseText).getIn(path);
  if (typeof v !== 'number') throw new Error(`no number at ${path.join('.')}`);
  return v;
}

function rulesOf(doc: Document, node: string): YAMLSeq<YAMLMap> {
  const rules = doc.getIn(['programs', node, 'rules']);
  if (!isSeq(rules) || !rules.items.every((r) => isMap(r))) throw new Error(`${node} has no list of rules`);
  return rules as YAMLSeq<YAMLMap>;
}

/** The program set with the named rules of one node removed. */
export function withoutRules(netText: string, node: string, names: readonly string[]): string {
  const doc = parseDocument(netText);
  const rules = rulesOf(doc, node);
  const before = rules.items.length;
  rules.items = rules.items.filter((r) => !names.includes(String(r.get('name'))));
  if (rules.items.length !== before - names.length) throw new Error(`${node} lacks one of the rules ${names.join(', ')}`);
  return doc.toString();
}

/** The program set with the `pick` of the first guard of one rule changed. */
export function withPick(netText: string, node: string, rule: string, pick: 'oldest' | 'newest'): string {
  const doc = parseDocument(netText);
  const r = rulesOf(doc, node).items.find((x) => String(x.get('name')) === rule);
  if (!r || r.getIn(['when', 0, 'have', 'pick']) === undefined) throw new Error(`${node}.${rule} has no pick to change`);
  r.setIn(['when', 0, 'have', 'pick'], pick);
  return doc.toString();
}

/** Mean delivered fidelity of a summary. */
export function meanFidelity(s: RunSummary): number {
  return s.delivered.reduce((a, d) => a + d.fidelity, 0) / s.delivered.length;
}
