/** `bellstep check`: validate a program set (and noise model), then run the static analysis (docs/cli.md). */
import { InputError, InputErrors } from '../../model/errors.js';
import { check } from '../../api/check.js';
import { loaded } from '../../api/inputs.js';
import type { Finding } from '../../model/index.js';
import { readInputs } from '../inputs.js';
import { EXIT, type CommandSpec } from '../spec.js';

/** Format tag of `check --json` output. */
export const CHECK_FORMAT = 'bellstep/check@1';

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

function textReport(findings: readonly Finding[]): string {
  return findings.map((f) => `${f.file}:${f.line}:${f.col}: ${f.message}\n  fix: ${f.fix}\n`).join('');
}

function errorJson(e: InputError) {
  return { code: e.code, file: e.file ?? null, line: e.line ?? null, col: e.col ?? null, field: e.field ?? null, message: e.message, fix: e.fix ?? null };
}

export const checkCommand: CommandSpec = {
  name: 'check',
  args: '<NET.yaml>',
  summary: 'validate a program set and noise model, then look for rules that cannot work (no simulation)',
  options: [
    { flags: '--noise <N.yaml>', description: 'noise model to validate with it (default: ideal)' },
    { flags: '--json', description: `print the result as JSON ("${CHECK_FORMAT}")` },
  ],
  async run({ io }, [netPath], opts) {
    const json = opts.json === true;
    const noisePath = opts.noise as string | undefined;
    let findings: Finding[];
    let summary: string;
    try {
      const inputs = readInputs(io, netPath, noisePath);
      findings = check(inputs);
      const { programSet } = loaded(inputs);
      const rules = Object.values(programSet.programs).reduce((n, p) => n + p.rules.length, 0);
      summary = `${plural(programSet.nodes.length, 'node')}, ${plural(programSet.links.length, 'link')}, ${plural(rules, 'rule')}`;
    } catch (err) {
      if (json && (err instanceof InputError || err instanceof InputErrors)) {
        const errors = err instanceof InputErrors ? err.errors : [err];
        io.stdout(`${JSON.stringify({ format: CHECK_FORMAT, ok: false, findings: [], errors: errors.map(errorJson) }, null, 2)}\n`);
        io.stderr(`bellstep: ${err.format()}\n`);
        return EXIT.input;
      }
      throw err;
    }
    if (json) {
      io.stdout(`${JSON.stringify({ format: CHECK_FORMAT, ok: findings.length === 0, findings, errors: [] }, null, 2)}\n`);
    } else if (findings.length === 0) {
      io.stdout(`${netPath}${noisePath ? ` with ${noisePath}` : ''}: valid (${summary}), no findings\n`);
    } else {
      io.stdout(`${textReport(findings)}${plural(findings.length, 'finding')} in ${netPath} (${summary})\n`);
    }
    return findings.length === 0 ? EXIT.ok : EXIT.problems;
  },
};
