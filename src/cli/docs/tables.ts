/**
 * The generated parts of the reference in docs/, each from the typed table that drives the
 * code: the functions of the expression language, the commands and flags, the exit codes,
 * the file limits, the debugger's keys and commands, the finding codes. `npm run docs`
 * writes them between markers; a test fails when the committed pages differ.
 */
import { INPUT_LIMITS, mebibytes } from '../../api/files.js';
import { arity, CONSTANTS, FUNCTIONS, signature } from '../../expr/index.js';
import { MESSAGE_FIELDS, PAIR_FIELDS } from '../../model/build-steps.js';
import { FINDING_CODES } from '../../model/lint-codes.js';
import { DURATION_UNIT_NAMES } from '../../model/units.js';
import { MAX_YAML_DEPTH, MAX_YAML_MARKS } from '../../model/yaml-source.js';
import { RESERVED_NAMES } from '../../model/zod-kit.js';
import { KEYS } from '../../tui/keys.js';
import { COMMANDS as TUI_COMMANDS } from '../../tui/commands.js';
import { COMMANDS } from '../commands/index.js';
import { EXIT } from '../spec.js';
import { guardTable, noiseKeys, programSetKeys, stepTable } from './schema-tables.js';

function cell(text: string): string {
  return text.replace(/\|/g, '\\|').replace(/\s*\n\s*/g, ' ');
}

const WHERE = { both: 'programs, breakpoints, expectations', program: 'node programs', debugger: 'breakpoints, watches, expectations' } as const;

function functions(): string {
  const rows = FUNCTIONS.map((f) => {
    const { min, max } = arity(f);
    const args = min === max ? String(min) : max === Infinity ? `${min} or more` : `${min} to ${max}`;
    return `| \`${signature(f)}\` | ${args} | ${WHERE[f.scope]} | ${cell(f.does)} |`;
  });
  const constants = CONSTANTS.map((c) => `| \`${c.name}\` | constant | everywhere | ${cell(c.does)} (${c.value}) |`);
  return ['| function | arguments | where | gives |', '|---|---|---|---|', ...rows, ...constants].join('\n');
}

/** What each exit code means (the codes are `EXIT` in cli/spec.ts). */
const EXIT_MEANS: Readonly<Record<keyof typeof EXIT, string>> = {
  ok: 'success: the run ended as asked, `check` found nothing, a replay verified',
  problems: 'an expectation failed, the run stalled, `check` found problems, a verify found a divergence, a seed of a sweep failed, or `diff` found the runs part ways',
  input: 'bad input or usage: the message names the file, line, column and field, and how to fix it; never a stack trace',
  internal: 'an internal error: the message says where the crash report and the automatic replay of the session so far were written',
};

function exitCodes(): string {
  const names = Object.keys(EXIT) as (keyof typeof EXIT)[];
  return ['| code | means |', '|---|---|', ...names.map((n) => `| ${EXIT[n]} | ${cell(EXIT_MEANS[n])} |`)].join('\n');
}

function commands(): string {
  const out: string[] = [];
  for (const c of COMMANDS) {
    out.push(`### \`bellstep ${c.name}\``, '', `\`bellstep ${c.name} ${c.args}\`: ${c.summary}.`, '');
    if (c.options.length) {
      out.push('| flag | what it does |', '|---|---|');
      for (const o of c.options) out.push(`| \`${o.flags}\` | ${cell(o.description)} |`);
      out.push('');
    }
  }
  return out.join('\n').trimEnd();
}

function inputLimits(): string {
  const rows = (Object.keys(INPUT_LIMITS) as (keyof typeof INPUT_LIMITS)[]).map((k) => `| ${k} | ${mebibytes(INPUT_LIMITS[k])} |`);
  return [
    '| input | at most |',
    '|---|---|',
    ...rows,
    '',
    `A program set or noise model may also hold at most ${MAX_YAML_MARKS.toLocaleString('en-US')} of the marks that start YAML entries (\`:\` \`-\` \`,\` \`[\` \`{\`, counted anywhere in the file), and nest lists and mappings at most ${MAX_YAML_DEPTH} levels deep. Parsing keeps every entry with its position, and these bounds keep that within a few hundred megabytes.`,
  ].join('\n');
}

function keys(): string {
  return ['| key | does |', '|---|---|', ...KEYS.map((k) => `| ${k.label.split(/\s{2,}/).map((l) => `\`${l}\``).join(' or ')} | ${cell(k.does)} |`)].join('\n');
}

function tuiCommands(): string {
  return ['| command | does |', '|---|---|', ...TUI_COMMANDS.map((c) => `| \`${cell(`${c.word}${c.args ? ` ${c.args}` : ''}`)}\` | ${cell(c.does)} |`)].join('\n');
}

function findings(): string {
  return ['| code | means | the run stops with an error when the rule fires |', '|---|---|---|', ...FINDING_CODES.map((f) => `| \`${f.code}\` | ${cell(f.means)} | ${f.stopsRun ? 'yes' : 'no'} |`)].join('\n');
}

/** What the built-in fields of a pair record and a message hold (their names are PAIR_FIELDS and MESSAGE_FIELDS). */
const FIELD_MEANS: Readonly<Record<string, string>> = {
  id: 'the shared pair id, e.g. `mill~quay#12`',
  partner: 'the node at the other end',
  stage: 'its current stage at this node',
  age: 'nanoseconds since the half arrived at this node',
  born: 'the time the half arrived at this node (ns)',
  kind: 'the message kind',
  from: 'the sending node',
  to: 'the receiving node',
  pair: 'the pair id the message is about, or null',
  sent: 'the time it was sent (ns)',
};

function recordFields(): string {
  const row = (owner: string, f: string) => {
    if (!(f in FIELD_MEANS)) throw new Error(`no words for the field "${f}"`);
    return `| ${owner} | \`${f}\` | ${FIELD_MEANS[f]} |`;
  };
  return ['| record | field | holds |', '|---|---|---|', ...PAIR_FIELDS.map((f) => row('pair', f)), ...MESSAGE_FIELDS.map((f) => row('message', f))].join('\n');
}

function reservedNames(): string {
  return [...RESERVED_NAMES].sort().map((n) => `\`${n}\``).join(', ');
}

function durationUnits(): string {
  return DURATION_UNIT_NAMES.map((u) => `\`${u}\``).join(', ');
}

/** Every generated section, by the name its markers give. */
export const SECTIONS: Readonly<Record<string, () => string>> = {
  'program-set-keys': programSetKeys,
  guards: guardTable,
  steps: stepTable,
  'record-fields': recordFields,
  'reserved-names': reservedNames,
  'duration-units': durationUnits,
  'noise-keys': noiseKeys,
  functions,
  'exit-codes': exitCodes,
  commands,
  'input-limits': inputLimits,
  keys,
  'tui-commands': tuiCommands,
  findings,
};
