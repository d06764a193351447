/**
 * The shape of a program set (docs/format.md) as zod schemas. They check structure only;
 * meaning (references, bindings, units to integers) is checked while building the typed
 * value. The same factory serves validation and the published JSON Schema.
 */
import { z } from 'zod';
import { count, describeValue, durationText, encodeIssue, humanErrorMap, keyed, lengthText, obj, word, type Mode } from './zod-kit.js';

/** Node ids: lower-case letters, digits and dashes, starting with a letter. */
export const NODE_ID_RE = /^[a-z][a-z0-9-]*$/;
/** Names bound by `as` and read in expressions. */
export const BIND_NAME_RE = /^[A-Za-z_][A-Za-z0-9_]*$/;
/** Stage names, message kinds and rule names. */
export const LABEL_RE = /^[A-Za-z_][A-Za-z0-9_-]*$/;

export const PROGRAM_SET_FORMAT = 'bellstep/program-set@1';
export const GUARD_KINDS = ['have', 'got', 'check'] as const;
export const STEP_KINDS = ['gate', 'measure', 'bell_measure', 'send', 'stage', 'note', 'correct', 'rebind', 'discard', 'deliver', 'if', 'log'] as const;

/** The raw (validated, not yet typed) data of one guard or step: a one-key mapping. */
export type RawItem = Readonly<Record<string, unknown>>;

export interface RawRule {
  readonly name: string;
  readonly when: readonly RawItem[];
  readonly do: readonly RawItem[];
}
/** A role (docs/format.md, "Roles"): a named rule list with parameters. */
export interface RawRole {
  readonly params?: readonly string[];
  readonly rules: readonly RawRule[];
}
/** A role a node plays: its name alone, or the name with parameter values. */
export type RawUse = string | { readonly role: string; readonly args?: Readonly<Record<string, unknown>> };
/** One node's program: the roles it plays, then its own rules. */
export interface RawProgram {
  readonly use?: readonly RawUse[];
  readonly rules?: readonly RawRule[];
}
export interface RawProgramSet {
  readonly format: string;
  readonly title?: string;
  readonly nodes: readonly { readonly id: string; readonly qubits: number }[];
  readonly links?: readonly { readonly ends: readonly [string, string]; readonly length: string; readonly slots: number }[];
  readonly roles?: Readonly<Record<string, RawRole>>;
  readonly programs?: Readonly<Record<string, RawProgram>>;
}

function schemas(mode: Mode) {
  const nodeId = () => word(NODE_ID_RE, 'a node id', '"mill" (lower-case letters, digits and "-")');
  const bindName = () => word(BIND_NAME_RE, 'a name', '"left" (letters, digits and "_")');
  const label = (what: string) => word(LABEL_RE, what, '"ready" (letters, digits, "_" and "-")');
  const expr = (what: string) => z.string().describe(`${what}: an expression (node ids are predefined names).`);
  const value = (what: string) =>
    z.union([z.string(), z.number(), z.boolean()]).describe(`${what}: an expression, or a number or true/false.`);
  const names = (what: string) => z.union([bindName(), z.array(bindName()).min(1)]).describe(`${what}: a name or a list of names.`);

  const have = obj(
    {
      partner: expr('The node the pairs are shared with').optional(),
      id: expr('The shared pair id to find (instead of partner)').optional(),
      stage: label('a stage name').describe('The stage the pairs must be in (default link, where generated pairs arrive).').optional(),
      count: count('How many pairs are needed (default 1).').optional(),
      as: names('Names bound to the pairs, in pick order').optional(),
      pick: z.enum(['oldest', 'newest']).describe('Which pairs to take first (default oldest).').optional(),
      min_age: durationText().describe('Only pairs at least this old at this node (since their half arrived), e.g. "3 ms".').optional(),
      max_age: durationText().describe('Only pairs at most this old at this node (since their half arrived).').optional(),
      min_wait: durationText().describe('Only pairs that have been in their current stage at least this long (arrival counts as entering link), e.g. "3 ms".').optional(),
      max_wait: durationText().describe('Only pairs that have been in their current stage at most this long.').optional(),
    },
    'Free pairs held with a partner (or the pair with a given id).',
  );
  const got = obj(
    {
      from: expr('The sending node (left out: any node)').optional(),
      kind: label('a message kind').describe('The message kind to wait for.'),
      as: bindName().describe('The name the message is bound to; it is consumed when the rule fires.').optional(),
    },
    'A message of this kind in the inbox.',
  );
  const guard = keyed(mode, 'guard', { have, got, check: value('A boolean condition') }, {}, 'A guard: have, got or check.');

  const pairName = (what: string) => bindName().describe(`${what}: the name of a pair bound by a have guard.`);
  // Steps nest through if/then/else, so the list refers back to the step schema lazily.
  const stepList = (): z.ZodType => z.array(z.lazy(() => step));
  const gate = obj({
    op: z.enum(['x', 'y', 'z', 'h', 's', 'sdg', 't', 'rx', 'ry', 'rz', 'cnot', 'cz', 'swap']).describe('The gate.'),
    on: z.union([pairName('The qubit'), z.array(pairName('A qubit')).min(1)]).describe('A pair name, or [control, target] for two-qubit gates.'),
    angle: value('Rotation angle in radians (rx, ry, rz only)').optional(),
  }, "A gate on this node's half of a pair (one pair) or halves (two pairs).");
  const measure = obj({
    on: pairName('The pair to measure'),
    basis: z.enum(['z', 'x', 'y']).describe('Measurement basis (default z).').optional(),
    as: bindName().describe('The name the measured bit (0 or 1) is bound to.').optional(),
  }, "A measurement of this node's half; the half is freed.");
  const bellMeasure = obj({
    on: z.tuple([pairName('First pair'), pairName('Second pair')]).describe('The two local halves to measure.'),
    as: z.tuple([bindName(), bindName()]).describe('Names for [Z bit, X bit].'),
  }, 'A Bell-state measurement of two local halves: the far ends are then entangled with each other.');
  const dataMap = (what: string) => z.record(z.string(), value('A value')).describe(what);
  const send = obj({
    to: expr('The destination node'),
    kind: label('a message kind').describe('The message kind.'),
    pair: value('The shared pair id the message is about').optional(),
    data: dataMap('Named values carried by the message.').optional(),
  }, 'A classical message to a node, over the shortest fiber path.');
  const stage = obj({ pair: pairName('The pair'), to: label('a stage name').describe('The stage to move the pair to.') }, 'Moves a held pair to another stage, which restarts its stage timer.');
  const note = obj({ pair: pairName('The pair'), set: dataMap('Values stored on the pair record.') }, "Stores values on this node's record of a pair, read later as PAIR.key.");
  const correct = obj({ pair: pairName('The pair'), x: value('1 to apply X').optional(), z: value('1 to apply Z').optional() }, "Applies X if x is 1, then Z if z is 1, to this node's half.");
  const rebind = obj({ pair: pairName('The pair'), partner: expr('The new partner').optional(), id: value('The new shared id').optional() }, "Updates this node's record of a pair after a swap: new partner and new shared id.");
  const ifStep = obj({
    if: value('The condition'),
    then: stepList().describe('Steps run when the condition holds.'),
    else: stepList().describe('Steps run otherwise.').optional(),
  }, 'A branch: the steps under then when the condition holds, else those under else.');
  const step: z.ZodType = keyed(
    mode,
    'step',
    {
      gate,
      measure,
      bell_measure: bellMeasure,
      send,
      stage,
      note,
      correct,
      rebind,
      discard: pairName('The pair to free'),
      deliver: pairName('The pair to hand to the application'),
      log: z.string().describe('Text for the event log; {expr} holes are filled in.'),
    },
    { if: ifStep },
    'A step of a rule body.',
  );

  const rule = obj(
    {
      name: label('a rule name'),
      when: z
        .array(guard)
        .min(1, {
          error: () =>
            encodeIssue({ m: 'a rule needs at least one guard (one with none would fire forever)', f: 'add a guard under "when:", e.g. "- have: {partner: mill, as: p}"' }),
        })
        .describe('Guards that must all hold (at least one).'),
      do: z.array(step).describe('Steps run atomically when the rule fires.'),
    },
    'A guarded rule.',
  );
  const roleName = () => word(LABEL_RE, 'a role name', '"repeater" (letters, digits, "_" and "-")');
  const role = obj(
    {
      params: z
        .array(bindName())
        .describe('Names that the rules may use like node ids; each node that plays the role gives them values under "args".')
        .optional(),
      rules: z.array(rule).min(1).describe("Rules tried, in this order, before the node's own rules."),
    },
    'A named rule list that many nodes can play, with parameters.',
  );
  // Each value is checked while expanding (a node id, a number or a quoted string), with a did-you-mean.
  const argText = 'The value of a parameter: a node id, a number, or a quoted string such as "\'near\'".';
  const argValue = mode === 'json' ? z.union([z.string(), z.number()]).describe(argText) : z.unknown().describe(argText);
  const useByName = roleName().describe('A role without parameters, by name.');
  const useWithArgs = obj(
    {
      role: roleName().describe('The role to play.'),
      args: z.record(mode === 'json' ? bindName() : z.string(), argValue).describe('A value for every parameter of the role.').optional(),
    },
    'A role to play, with a value for each of its parameters.',
  );
  const useText = 'A role the node plays: its name, or {role: NAME, args: {...}}.';
  // Validation picks the variant by the value's type, so errors are those of the intended form.
  const use =
    mode === 'json'
      ? z.union([useByName, useWithArgs]).describe(useText)
      : z.unknown().superRefine((value, ctx) => {
          if (typeof value !== 'string' && (typeof value !== 'object' || value === null || Array.isArray(value))) {
            ctx.addIssue({ code: 'custom', input: value, message: encodeIssue({ m: `expected a role name or {role: NAME, args: {...}}, got ${describeValue(value)}`, f: 'write e.g. "- relabel" or "- {role: repeater, args: {left: s0, right: s4}}"' }) });
            return;
          }
          const r = (typeof value === 'string' ? useByName : useWithArgs).safeParse(value, { error: humanErrorMap });
          if (!r.success) for (const i of r.error.issues) ctx.addIssue({ code: 'custom', message: i.message, path: i.path, input: value });
        });
  const program = obj(
    {
      use: z.array(use).describe("The roles this node plays; their rules are tried first, in this order.").optional(),
      rules: z.array(rule).describe("The node's own rules, tried after its roles' rules, after every event that touches the node.").optional(),
    },
    'The rules one node runs: the roles it plays, then its own rules.',
  );
  const node = obj({ id: nodeId(), qubits: count('Memory qubits at this node.') });
  const link = obj({
    ends: z.tuple([nodeId(), nodeId()]).describe('The two node ids the fiber joins.'),
    length: lengthText(),
    slots: count("Qubits at each end reserved for this link's pair generation."),
  });
  const programSet = obj(
    {
      format: z.literal(PROGRAM_SET_FORMAT).describe(`Always "${PROGRAM_SET_FORMAT}".`),
      title: z.string().describe('A short human title.').optional(),
      nodes: z.array(node).min(1).describe('The sites of the network.'),
      links: z.array(link).describe('Fiber links that generate Bell pairs.').optional(),
      roles: z
        // Names are checked while expanding, so a bad one is reported with its position.
        .record(mode === 'json' ? roleName() : z.string(), role)
        .describe('Named rule lists with parameters, which nodes play through "use".')
        .optional(),
      programs: z
        // Keys are checked against the declared nodes after validation, with a did-you-mean.
        .record(mode === 'json' ? nodeId() : z.string(), program)
        .describe('The rules each node runs, keyed by node id.')
        .optional(),
    },
    'A bellstep program set: the network and the rules its nodes run.',
  );
  // The same file in parts, each list entry and mapping value checked on its own, so that one
  // wrong entry does not hide the mistakes of the others (model/partial-program.ts).
  const parts = {
    shell: obj({
      format: z.literal(PROGRAM_SET_FORMAT),
      title: z.string().describe('A short human title.').optional(),
      nodes: z.array(z.unknown()).min(1).describe('The sites of the network.'),
      links: z.array(z.unknown()).describe('Fiber links that generate Bell pairs.').optional(),
      roles: z.record(z.string(), z.unknown()).describe('Named rule lists with parameters, which nodes play through "use".').optional(),
      programs: z.record(z.string(), z.unknown()).describe('The rules each node runs, keyed by node id.').optional(),
    }),
    node,
    link,
    rule,
    use,
    roleShell: obj({ params: role.shape.params, rules: z.array(z.unknown()).min(1).describe("Rules tried, in this order, before the node's own rules.") }),
    programShell: obj({
      use: z.array(z.unknown()).describe('The roles this node plays; their rules are tried first, in this order.').optional(),
      rules: z.array(z.unknown()).describe("The node's own rules, tried after its roles' rules, after every event that touches the node.").optional(),
    }),
  };
  return { programSet, guard, step, parts };
}

/** Schemas used to validate files (one-key mappings dispatch on their key). */
export const programValidation = schemas('validate');
/** Schemas published as JSON Schema (one-key mappings as unions). */
export const programJson = schemas('json');
