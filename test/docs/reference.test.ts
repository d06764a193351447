/**
 * The reference in docs/ cannot drift from the code: its generated tables are what the typed
 * tables give now (`npm run docs` rewrites them), every name it documents is accepted by the
 * parser, and every name the parser accepts is documented.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { renderDocs, sectionNames } from '../../src/cli/docs/render.js';
import { GUARD_EXAMPLES, STEP_EXAMPLES } from '../../src/cli/docs/schema-tables.js';
import { SECTIONS } from '../../src/cli/docs/tables.js';
import { COMMANDS } from '../../src/cli/commands/index.js';
import { arity, FUNCTIONS, parseExpr } from '../../src/expr/index.js';
import { FINDING_CODES } from '../../src/model/lint-codes.js';
import { programJson } from '../../src/model/schema-program.js';
import { noiseJson } from '../../src/model/schema-noise.js';
import { runCli } from '../helpers/run-cli.js';

const pages = readdirSync('docs').filter((f) => f.endsWith('.md')).sort();
const read = (page: string) => readFileSync(`docs/${page}`, 'utf8');

/** The rows of the markdown table that follows a generated marker. */
function tableRows(page: string, section: string): string[][] {
  const text = read(page);
  const from = text.indexOf(`<!-- generated: ${section} `);
  const to = text.indexOf(`<!-- end generated: ${section} -->`);
  expect(from, `${page} has the section ${section}`).toBeGreaterThan(-1);
  return text
    .slice(from, to)
    .split('\n')
    .filter((l) => l.startsWith('|') && !l.startsWith('|---'))
    .slice(1)
    .map((l) => l.split(/(?<!\\)\|/).slice(1, -1).map((c) => c.trim()));
}

const code = (c: string) => /^`([^`]+)`/.exec(c)?.[1] ?? '';

/** The keys of each one-key variant of a union schema (JSON Schema form). */
function variants(union: unknown): Map<string, string[]> {
  const out = new Map<string, string[]>();
  const def = (s: unknown) => (s as { _zod: { def: { type: string; options?: unknown[]; shape?: Record<string, unknown>; innerType?: unknown } } })._zod.def;
  for (const o of def(union).options ?? []) {
    const shape = def(o).shape ?? {};
    const keys = Object.keys(shape);
    if (keys.length === 1) {
      let inner = shape[keys[0]];
      while (def(inner).type === 'optional') inner = def(inner).innerType;
      out.set(keys[0], Object.keys(def(inner).shape ?? {}));
    } else out.set(keys[0], keys);
  }
  return out;
}

describe('docs/', () => {
  it.each(pages)('%s: its generated tables are what the code’s tables give (run npm run docs)', (page) => {
    const text = read(page);
    expect(renderDocs(text), `docs/${page} differs: run npm run docs`).toBe(text);
  });

  it('uses every generated section somewhere, and the docs script exists', () => {
    const used = pages.flatMap((p) => sectionNames(read(p)));
    expect(new Set(used)).toEqual(new Set(Object.keys(SECTIONS)));
    expect(JSON.parse(readFileSync('package.json', 'utf8')).scripts.docs).toContain('src/cli/docs/write.ts');
  });

  it('documents exactly the guards and steps the parser accepts, with every field', () => {
    for (const [section, union] of [
      ['guards', programJson.guard],
      ['steps', programJson.step],
    ] as const) {
      const documented = new Map<string, string[]>();
      let current = '';
      for (const [name, field] of tableRows('format.md', section)) {
        if (code(name)) documented.set((current = code(name)), []);
        if (code(field)) documented.get(current)!.push(code(field));
      }
      const accepted = variants(union);
      expect([...documented.keys()].sort(), section).toEqual([...accepted.keys()].sort());
      for (const [name, fields] of accepted) expect(documented.get(name)!.sort(), `${section}: ${name}`).toEqual([...fields].sort());
    }
  });

  it('gives an example of every guard and step, and each example loads', async () => {
    const guards = Object.values(GUARD_EXAMPLES).map((g) => `          - ${g.example}`);
    const steps = Object.entries(STEP_EXAMPLES).map(([k, s]) => (k === 'if' ? `          - {${s.example}, then: [{log: "one"}], else: [{log: "zero"}]}` : `          - ${s.example}`));
    const net = `format: bellstep/program-set@1
nodes:
  - {id: mill, qubits: 2}
  - {id: quay, qubits: 2}
links:
  - {ends: [mill, quay], length: 1 km, slots: 2}
programs:
  quay:
    rules:
      - name: round
        when:
          - have: {partner: mill, count: 2, as: [keep, probe]}
        do:
${steps.filter((s) => !/discard: probe|deliver: keep|bell_measure|measure:|if:/.test(s)).join('\n')}
          - ${STEP_EXAMPLES.measure.example}
${steps.find((s) => s.includes('if:'))}
          - ${STEP_EXAMPLES.deliver.example}
      - name: swap
        when:
          - have: {partner: mill, count: 2, as: [keep, probe]}
        do:
          - ${STEP_EXAMPLES.bell_measure.example}
      - name: drop
        when:
          - have: {partner: mill, as: probe}
        do:
          - ${STEP_EXAMPLES.discard.example}
      - name: conclude
        when:
${guards.join('\n')}
        do: [{deliver: keep}]
  mill:
    rules:
      - name: answer
        when: [{have: {partner: quay, as: p}}]
        do:
          - send: {to: quay, kind: verdict, pair: p.id}
          - deliver: p
`;
    const r = await runCli(['check', 'n.net.yaml', '--json'], { 'n.net.yaml': net });
    expect(r.stderr).toBe('');
    expect(JSON.parse(r.stdout).errors).toEqual([]);
  });

  it('documents exactly the keys of the noise model', () => {
    const documented = tableRows('noise.md', 'noise-keys').map((r) => code(r[0]));
    const accepted: string[] = [];
    const def = (s: unknown) => (s as { _zod: { def: Record<string, unknown> } })._zod.def;
    const walk = (prefix: string, s: unknown): void => {
      let x = s;
      while (def(x).type === 'optional') x = def(x).innerType;
      const d = def(x);
      if (d.type === 'object') {
        for (const [k, v] of Object.entries(d.shape as Record<string, unknown>)) {
          accepted.push(`${prefix}${k}`);
          walk(`${prefix}${k}.`, v);
        }
      } else if (d.type === 'record') walk(`${prefix}${prefix.startsWith('links') ? 'LINK' : 'NODE'}.`, d.valueType);
      else if (d.type === 'array') walk(`${prefix.replace(/\.$/, '')}[].`, d.element);
      else if (d.type === 'union') for (const o of d.options as unknown[]) walk(prefix, o);
    };
    walk('', noiseJson.noise);
    expect(new Set(documented)).toEqual(new Set(accepted));
  });

  it('documents every function with the arity the parser checks, and no other', () => {
    const rows = tableRows('expressions.md', 'functions').filter((r) => r[1] !== 'constant');
    expect(rows.map((r) => code(r[0]).replace(/\(.*$/, '')).sort()).toEqual(FUNCTIONS.map((f) => f.name).sort());
    for (const f of FUNCTIONS) {
      const { min, max } = arity(f);
      const args = (n: number) => Array.from({ length: n }, () => '1').join(', ');
      expect(() => parseExpr(`${f.name}(${args(min)})`)).not.toThrow();
      if (max !== Infinity) expect(() => parseExpr(`${f.name}(${args(max + 1)})`)).toThrow(/takes/);
    }
  });

  it('documents every command and flag of the CLI', () => {
    const cli = read('cli.md');
    for (const c of COMMANDS) {
      expect(cli).toContain(`### \`bellstep ${c.name}\``);
      for (const o of c.options) expect(cli, `${c.name} ${o.flags}`).toContain(`\`${o.flags}\``);
    }
  });

  it('documents every finding code check can report, and only those', () => {
    const src = readdirSync('src/model')
      .filter((f) => f.startsWith('lint'))
      .map((f) => readFileSync(`src/model/${f}`, 'utf8'))
      .join('\n');
    const emitted = new Set([...src.matchAll(/(?:finding|report)\(\s*'([a-z-]+)'|\(e, [^,]+, '([a-z-]+)',/g)].map((m) => m[1] ?? m[2]));
    // codes passed through a variable: every literal code the lint files name
    for (const m of src.matchAll(/'((?:rule|message|stage|partner|pair|type|division|number)-[a-z-]+)'/g)) emitted.add(m[1]);
    emitted.delete('pair-id');
    expect([...emitted].sort()).toEqual(FINDING_CODES.map((f) => f.code).sort());
    const rows = tableRows('checks.md', 'findings').map((r) => code(r[0]));
    expect(rows).toEqual(FINDING_CODES.map((f) => f.code));
  });

  it('points users at its own pages only', () => {
    for (const page of pages) {
      const text = read(page);
      expect(text, page).not.toMatch(/FORMAT\.md|REFERENCES\.md|\.\.\/shared/);
      for (const m of text.matchAll(/\]\(([a-z-]+\.md)(#[^)]*)?\)/g)) expect(pages, `${page} links to ${m[1]}`).toContain(m[1]);
    }
  });
});
