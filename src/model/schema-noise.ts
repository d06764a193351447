/** The shape of a noise model (docs/noise.md) as zod schemas, for validation and JSON Schema alike. */
import { z } from 'zod';
import { NODE_ID_RE, LABEL_RE } from './schema-program.js';
import { DURATION_PATTERN } from './units.js';
import { count, describeValue, durationText, encodeIssue, humanErrorMap, keyed, lossText, obj, probability, speedText, word, type Mode } from './zod-kit.js';

export const NOISE_FORMAT = 'bellstep/noise@1';
/** A link id: two node ids joined by "~" (sortedness is checked separately, with a fix). */
const LINK_ID_RE = /^[a-z][a-z0-9-]*~[a-z][a-z0-9-]*$/;

type Prob = number;
export interface RawLinkNoise {
  readonly pair?: { readonly werner?: Prob; readonly bit_flip?: Prob; readonly bell_diagonal?: readonly [number, number, number, number] };
  readonly success?:
    | Prob
    | { readonly scheme: 'double-click' | 'single-click'; readonly fiber_loss: string; readonly detector_efficiency: Prob; readonly bright_state?: Prob };
  readonly attempt_period?: string;
}
export interface RawMemory {
  readonly t1?: string;
  readonly t2?: string;
}
export interface RawGateSpec {
  readonly depolarizing?: Prob;
  readonly flip?: Prob;
  readonly duration?: string;
}
export interface RawGates {
  readonly single?: RawGateSpec;
  readonly two?: RawGateSpec;
  readonly measure?: RawGateSpec;
}
export interface RawFaultBody {
  readonly from?: string;
  readonly to?: string;
  readonly kind?: string;
  readonly nth?: number;
  readonly by?: string;
}
export interface RawNoise {
  readonly format: string;
  readonly seed: number;
  readonly defaults?: {
    readonly link?: RawLinkNoise;
    readonly memory?: RawMemory;
    readonly gates?: RawGates;
    readonly classical?: { readonly speed?: string; readonly loss?: Prob; readonly extra_delay?: string };
  };
  readonly links?: Readonly<Record<string, RawLinkNoise>>;
  readonly nodes?: Readonly<Record<string, { readonly memory?: RawMemory; readonly gates?: RawGates }>>;
  readonly faults?: readonly Readonly<Record<'drop' | 'delay', RawFaultBody | undefined>>[];
}

const ATTEMPT_FIX = 'write "fiber" (link length over the fiber speed) or a duration with a unit, e.g. "10 us"';

function schemas(mode: Mode) {
  const nodeId = () => word(NODE_ID_RE, 'a node id', '"mill"');
  const pair = keyed(
    mode,
    'pair state',
    {
      werner: probability('Werner fidelity F: F Φ+ plus (1-F)/3 of each other Bell state'),
      bit_flip: probability('Fidelity F of F Φ+ + (1-F) Ψ+'),
      bell_diagonal: z.tuple([z.number(), z.number(), z.number(), z.number()]).describe('Bell coefficients in the order [Φ+, Φ−, Ψ+, Ψ−], summing to 1.'),
    },
    {},
    'The state of a freshly generated pair.',
  );
  const derived = obj(
    {
      scheme: z.enum(['double-click', 'single-click']).describe('Heralding scheme.'),
      fiber_loss: lossText(),
      detector_efficiency: probability('Detector efficiency'),
      bright_state: probability('Bright-state population (single-click only)').optional(),
    },
    'Success probability derived from the link length.',
  );
  const fixed = probability('Success probability per attempt');
  // A number or a mapping: dispatch on the type so the message is about the intended form.
  const success =
    mode === 'json'
      ? z.union([fixed, derived]).describe('Success probability per attempt, or how to derive it.')
      : z.unknown().superRefine((v, ctx) => {
          const schema = typeof v === 'object' && v !== null && !Array.isArray(v) ? derived : fixed;
          const r = (schema as z.ZodType).safeParse(v, { error: humanErrorMap });
          if (!r.success) for (const i of r.error.issues) ctx.addIssue({ code: 'custom', message: i.message, path: i.path, input: v });
        });
  const attemptRe = new RegExp(`^\\s*fiber\\s*$|${DURATION_PATTERN}`, 'u');
  const attempt = z
    .string({ error: (iss) => (iss.input === undefined ? undefined : encodeIssue({ m: `expected "fiber" or a duration such as "10 us", got ${describeValue(iss.input)}`, f: ATTEMPT_FIX })) })
    .regex(attemptRe, { error: (iss) => encodeIssue({ m: `expected "fiber" or a duration such as "10 us", got ${describeValue(iss.input)}`, f: ATTEMPT_FIX }) })
    .describe('Time between attempts: "fiber" (link length over the fiber speed) or a duration.');
  const link = obj({ pair: pair.optional(), success: success.optional(), attempt_period: attempt.optional() }, 'Pair generation on a link.');
  const memory = obj(
    {
      t1: durationText().describe('Energy relaxation time T1 (amplitude damping), more than 0.').optional(),
      t2: durationText().describe('Coherence time T2 (dephasing), more than 0 and at most 2·T1.').optional(),
    },
    'Memory decay times; leave one out for no such decay.',
  );
  const gate = (what: string) =>
    obj({ depolarizing: probability('Depolarizing probability after each gate').optional(), duration: durationText().describe(`How long each ${what} gate takes (default 0).`).optional() }, `${what[0].toUpperCase()}${what.slice(1)} gates.`);
  const readout = obj(
    { flip: probability('Probability that a measured bit comes out flipped').optional(), duration: durationText().describe('How long a measurement takes (default 0).').optional() },
    'Measurements.',
  );
  const gates = obj({ single: gate('one-qubit').optional(), two: gate('two-qubit').optional(), measure: readout.optional() }, 'Gate and measurement errors and durations.');
  const classical = obj(
    {
      speed: speedText().describe('Speed of messages and heralds in fiber, more than 0 (default 200000 km/s).').optional(),
      loss: probability('Message loss probability').optional(),
      extra_delay: durationText().describe('Added to every message delay (default 0).').optional(),
    },
    'Classical messages.',
  );
  const match = { from: nodeId().optional(), to: nodeId().optional(), kind: word(LABEL_RE, 'a message kind', '"bits"').optional() };
  const faultBy = durationText().describe('How much later matching messages arrive.');
  const fault = keyed(
    mode,
    'fault',
    {
      drop: obj({ ...match, nth: count('Which matching message to drop (1 = the first).') }, 'Drop the nth matching message.'),
      delay: obj({ ...match, by: faultBy }, 'Delay matching messages.'),
    },
    {},
    'A deterministic fault.',
  );
  const defaults = obj({ link: link.optional(), memory: memory.optional(), gates: gates.optional(), classical: classical.optional() }, 'Settings for every link and node that has none of its own.');
  const nodeNoise = obj({ memory: memory.optional(), gates: gates.optional() });
  const seed = z.int().min(0).describe('Seed of the random generator (the CLI\'s --seed overrides it).');
  const noise = obj(
    {
      format: z.literal(NOISE_FORMAT).describe(`Always "${NOISE_FORMAT}".`),
      seed,
      defaults: defaults.optional(),
      links: z.record(mode === 'json' ? word(LINK_ID_RE, 'a link id', '"mill~quay"') : z.string(), link).describe('Per-link settings, keyed by link id (ends sorted, e.g. "mill~quay").').optional(),
      nodes: z.record(mode === 'json' ? nodeId() : z.string(), nodeNoise).describe('Per-node settings, keyed by node id.').optional(),
      faults: z.array(fault).describe('Deterministic fault injection.').optional(),
    },
    'A bellstep noise model: the physics and the seed.',
  );
  // The file in parts, each checked on its own so one wrong entry hides no other mistake.
  const parts = {
    shell: obj({
      format: z.literal(NOISE_FORMAT),
      seed,
      defaults: z.unknown().optional(),
      links: z.record(z.string(), z.unknown()).optional(),
      nodes: z.record(z.string(), z.unknown()).optional(),
      faults: z.array(z.unknown()).optional(),
    }),
    defaultsShell: obj({ link: z.unknown().optional(), memory: z.unknown().optional(), gates: z.unknown().optional(), classical: z.unknown().optional() }),
    defaults: { link, memory, gates, classical },
    link,
    node: nodeNoise,
    fault,
  };
  return { noise, parts };
}

/** Schemas used to validate noise files. */
export const noiseValidation = schemas('validate');
/** Schemas published as JSON Schema. */
export const noiseJson = schemas('json');
