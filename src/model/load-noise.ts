/** Loads a noise model (`*.noise.yaml`, docs/noise.md), merging per-link and per-node settings over the defaults. */
import type { z } from 'zod';
import { FileCtx } from './file-ctx.js';
import { InputErrors, type InputError } from './errors.js';
import { sortErrors } from './file-ctx.js';
import { checkFormatTag } from './format-tag.js';
import { validate } from './issues.js';
import { NOISE_FORMAT, noiseValidation, type RawGates, type RawLinkNoise, type RawMemory, type RawNoise } from './schema-noise.js';
import { SourceDoc } from './yaml-source.js';
import { NODE_ID_RE } from './schema-program.js';
import type { ClassicalNoise, Fault, GateNoise, LinkNoise, MemoryNoise, NodeNoise, NoiseModel, PairStateSpec, SuccessSpec } from './types.js';
import { parseDuration, parseLoss, parseSpeed } from './units.js';
import type { Path } from './yaml-source.js';

/** Light in fiber, about 200,000 km/s (common practice). */
export const FIBER_SPEED_M_PER_S = 2e8;

const IDEAL_LINK: LinkNoise = { pair: { kind: 'werner', f: 1 }, success: { kind: 'fixed', p: 1 }, attemptPeriod: 'fiber' };
const IDEAL_GATES: GateNoise = {
  single: { depolarizing: 0, durationNs: 0 },
  two: { depolarizing: 0, durationNs: 0 },
  measure: { flip: 0, durationNs: 0 },
};
const IDEAL_CLASSICAL: ClassicalNoise = { speedMPerS: FIBER_SPEED_M_PER_S, loss: 0, extraDelayNs: 0 };

/** The model used when no noise file is given: perfect Φ+ pairs on every attempt and no errors anywhere. */
export function idealNoise(seed = 1): NoiseModel {
  return { file: '', text: '', seed, defaults: { link: IDEAL_LINK, memory: {}, gates: IDEAL_GATES, classical: IDEAL_CLASSICAL }, links: {}, nodes: {}, faults: [] };
}

/** The generation settings of a link: its own entry, else the defaults. */
export function linkNoiseFor(noise: NoiseModel, linkId: string): LinkNoise {
  return Object.hasOwn(noise.links, linkId) ? noise.links[linkId] : noise.defaults.link;
}

/** The memory and gate settings of a node: its own entry, else the defaults. */
export function nodeNoiseFor(noise: NoiseModel, nodeId: string): NodeNoise {
  return Object.hasOwn(noise.nodes, nodeId) ? noise.nodes[nodeId] : { memory: noise.defaults.memory, gates: noise.defaults.gates };
}

class NoiseBuilder {
  constructor(private readonly ctx: FileCtx) {}

  private duration(path: Path, text: string | undefined): number | undefined {
    return text === undefined ? undefined : this.ctx.unit(path, text, parseDuration);
  }

  private pair(path: Path, raw: NonNullable<RawLinkNoise['pair']>): PairStateSpec | undefined {
    if (raw.werner !== undefined) return { kind: 'werner', f: raw.werner };
    if (raw.bit_flip !== undefined) return { kind: 'bit_flip', f: raw.bit_flip };
    const c = raw.bell_diagonal as [number, number, number, number];
    const p = [...path, 'bell_diagonal'];
    const negative = c.findIndex((x) => x < 0);
    if (negative >= 0) {
      this.ctx.error([...p, negative], { code: 'schema', message: `Bell coefficients cannot be negative, got ${c[negative]}`, fix: 'give four probabilities [Φ+, Φ−, Ψ+, Ψ−] that sum to 1' });
      return undefined;
    }
    const sum = c.reduce((s, x) => s + x, 0);
    if (Math.abs(sum - 1) > 1e-9) {
      this.ctx.error(p, { code: 'schema', message: `Bell coefficients must sum to 1, got ${sum}`, fix: 'adjust the four values [Φ+, Φ−, Ψ+, Ψ−] so they add up to 1' });
      return undefined;
    }
    return { kind: 'bell_diagonal', coeffs: c };
  }

  private success(path: Path, raw: NonNullable<RawLinkNoise['success']>): SuccessSpec | undefined {
    if (typeof raw === 'number') return { kind: 'fixed', p: raw };
    if (raw.scheme === 'single-click' && raw.bright_state === undefined) {
      this.ctx.error(path, { code: 'schema', message: 'single-click heralding needs "bright_state"', fix: 'add e.g. "bright_state: 0.05" (fidelity is about 1 - bright_state)' });
    }
    if (raw.scheme === 'double-click' && raw.bright_state !== undefined) {
      this.ctx.error(path, { code: 'schema', message: '"bright_state" is only for single-click heralding', fix: 'remove it, or use "scheme: single-click"' }, 'bright_state');
    }
    const loss = this.ctx.unit([...path, 'fiber_loss'], raw.fiber_loss, parseLoss);
    if (loss === undefined) return undefined;
    return {
      kind: 'derived',
      scheme: raw.scheme,
      fiberLossDbPerKm: loss,
      detectorEfficiency: raw.detector_efficiency,
      ...(raw.scheme === 'single-click' && raw.bright_state !== undefined ? { brightState: raw.bright_state } : {}),
    };
  }

  link(path: Path, raw: RawLinkNoise | undefined, base: LinkNoise): LinkNoise {
    if (!raw) return base;
    const pair = raw.pair === undefined ? undefined : this.pair([...path, 'pair'], raw.pair);
    const success = raw.success === undefined ? undefined : this.success([...path, 'success'], raw.success);
    let attemptPeriod: LinkNoise['attemptPeriod'] | undefined;
    if (raw.attempt_period !== undefined) {
      attemptPeriod = raw.attempt_period.trim() === 'fiber' ? 'fiber' : this.duration([...path, 'attempt_period'], raw.attempt_period);
    }
    return { pair: pair ?? base.pair, success: success ?? base.success, attemptPeriod: attemptPeriod ?? base.attemptPeriod };
  }

  /** A decay time: a duration of more than 0 (leaving the key out means no such decay). */
  private decayTime(path: Path, text: string | undefined): number | undefined {
    const ns = this.duration(path, text);
    if (ns === 0) {
      this.ctx.error(path, {
        code: 'unit',
        message: `a decay time of ${text} would destroy a qubit at once`,
        fix: 'give a time of more than 0, or leave the key out for a memory without that decay',
      });
      return undefined;
    }
    return ns;
  }

  memory(path: Path, raw: RawMemory | undefined, base: MemoryNoise, whose: string): MemoryNoise {
    const t1Ns = this.decayTime([...path, 't1'], raw?.t1) ?? base.t1Ns;
    const t2Ns = this.decayTime([...path, 't2'], raw?.t2) ?? base.t2Ns;
    // Checked after merging: a node's T2 may conflict with the default T1.
    if (t1Ns !== undefined && t2Ns !== undefined && t2Ns > 2 * t1Ns) {
      this.ctx.error(raw?.t2 !== undefined ? [...path, 't2'] : path, {
        code: 'schema',
        message: `T2 cannot exceed 2·T1 (${whose}: T1 ${raw?.t1 ?? 'from defaults'}, T2 ${raw?.t2 ?? 'from defaults'})`,
        fix: 'coherence cannot outlive twice the energy relaxation time; shorten t2 or lengthen t1',
      });
    }
    return { ...(t1Ns === undefined ? {} : { t1Ns }), ...(t2Ns === undefined ? {} : { t2Ns }) };
  }

  gates(path: Path, raw: RawGates | undefined, base: GateNoise): GateNoise {
    const one = (k: 'single' | 'two') => ({
      depolarizing: raw?.[k]?.depolarizing ?? base[k].depolarizing,
      durationNs: this.duration([...path, k, 'duration'], raw?.[k]?.duration) ?? base[k].durationNs,
    });
    return {
      single: one('single'),
      two: one('two'),
      measure: {
        flip: raw?.measure?.flip ?? base.measure.flip,
        durationNs: this.duration([...path, 'measure', 'duration'], raw?.measure?.duration) ?? base.measure.durationNs,
      },
    };
  }

  classical(raw: NonNullable<RawNoise['defaults']>['classical']): ClassicalNoise {
    const p = ['defaults', 'classical'];
    let speed = raw?.speed === undefined ? IDEAL_CLASSICAL.speedMPerS : this.ctx.unit([...p, 'speed'], raw.speed, parseSpeed);
    if (speed === 0) {
      // nothing would ever arrive, and every herald would wait for ever
      this.ctx.error([...p, 'speed'], { code: 'unit', message: `a speed of ${raw?.speed} would never deliver a message or a herald`, fix: 'give a speed of more than 0, e.g. "200000 km/s" (light in fiber)' });
      speed = undefined;
    }
    return {
      speedMPerS: speed ?? IDEAL_CLASSICAL.speedMPerS,
      loss: raw?.loss ?? 0,
      extraDelayNs: this.duration([...p, 'extra_delay'], raw?.extra_delay) ?? 0,
    };
  }

  linkKey(key: string): void {
    const m = /^([^~]+)~([^~]+)$/.exec(key);
    if (!m || !NODE_ID_RE.test(m[1]) || !NODE_ID_RE.test(m[2])) {
      this.ctx.error(['links'], { code: 'reference', message: `"${key}" is not a link id`, fix: 'a link id is two node ids joined by "~", ends sorted, e.g. "mill~quay"' }, key);
    } else if (m[1] === m[2]) {
      this.ctx.error(['links'], { code: 'reference', message: `"${key}" joins a node to itself`, fix: 'a link id names two different nodes' }, key);
    } else if (m[1] > m[2]) {
      this.ctx.error(['links'], { code: 'reference', message: `link ids have their ends sorted: "${key}" should be "${m[2]}~${m[1]}"`, fix: `write "${m[2]}~${m[1]}"` }, key);
    }
  }

  faults(raw: RawNoise['faults']): Fault[] {
    return (raw ?? []).map((f, i) => {
      const kind = f.drop !== undefined ? 'drop' : 'delay';
      const body = (f.drop ?? f.delay)!;
      const match = { ...(body.from ? { from: body.from } : {}), ...(body.to ? { to: body.to } : {}), ...(body.kind ? { msgKind: body.kind } : {}) };
      const pos = this.ctx.pos(['faults', i]);
      if (kind === 'drop') return { kind, nth: body.nth as number, pos, ...match };
      return { kind, byNs: this.duration(['faults', i, 'delay', 'by'], body.by) ?? 0, pos, ...match };
    });
  }
}

/** Parses and validates a noise model; throws InputErrors naming file:line:col for anything wrong. */
export function loadNoiseModel(file: string, text: string): NoiseModel {
  const { model, errors } = loadNoiseParts(file, text);
  if (errors.length > 0) throw new InputErrors(sortErrors(errors));
  return model;
}

/** The valid parts of a noise file, checked part by part, so that one wrong entry hides no other. */
function noiseParts(src: SourceDoc, errors: InputError[]): RawNoise {
  const parts = noiseValidation.parts;
  const top = src.value as Record<string, unknown>;
  const isMap = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
  const shell = validate(src, parts.shell, top, errors, []);
  let defaults: Record<string, unknown> | undefined;
  if (top.defaults !== undefined && validate(src, parts.defaultsShell, top.defaults, errors, ['defaults'])) {
    defaults = {};
    const d = top.defaults as Record<string, unknown>;
    for (const k of ['link', 'memory', 'gates', 'classical'] as const) {
      if (d[k] === undefined) continue;
      const ok = validate(src, parts.defaults[k] as z.ZodType<unknown>, d[k], errors, ['defaults', k]);
      if (ok) defaults[k] = ok;
    }
  }
  const links: Record<string, RawLinkNoise> = {};
  for (const [k, v] of Object.entries(isMap(top.links) ? top.links : {})) {
    const ok = validate(src, parts.link, v, errors, ['links', k]);
    if (ok) links[k] = ok as RawLinkNoise;
  }
  const nodes: Record<string, { memory?: RawMemory; gates?: RawGates }> = {};
  for (const [k, v] of Object.entries(isMap(top.nodes) ? top.nodes : {})) {
    const ok = validate(src, parts.node, v, errors, ['nodes', k]);
    if (ok) nodes[k] = ok as { memory?: RawMemory; gates?: RawGates };
  }
  // a wrong entry leaves a hole, so the others keep their index (faults[3]) in later messages;
  // holes only ever exist alongside errors, and then the model is only cross-checked
  const list: unknown[] = Array.isArray(top.faults) ? top.faults : [];
  const faults: NonNullable<RawNoise['faults']>[number][] = [];
  faults.length = list.length;
  list.forEach((f, i) => {
    const ok = validate(src, parts.fault, f, errors, ['faults', i]);
    if (ok) faults[i] = ok as NonNullable<RawNoise['faults']>[number];
  });
  return { format: NOISE_FORMAT, seed: shell?.seed ?? 0, ...(defaults ? { defaults: defaults as RawNoise['defaults'] } : {}), links, nodes, faults };
}

/** Loads a noise file as far as it is valid: the model from its valid parts, and every error found. */
export function loadNoiseParts(file: string, text: string): { model: NoiseModel; errors: InputError[] } {
  const src = SourceDoc.parse(file, text);
  checkFormatTag(src, 'noise model');
  const ctx = new FileCtx(src);
  const raw = noiseParts(src, ctx.errors);
  const b = new NoiseBuilder(ctx);
  const d = raw.defaults;
  const defaults = {
    link: b.link(['defaults', 'link'], d?.link, IDEAL_LINK),
    memory: b.memory(['defaults', 'memory'], d?.memory, {}, 'defaults'),
    gates: b.gates(['defaults', 'gates'], d?.gates, IDEAL_GATES),
    classical: b.classical(d?.classical),
  };
  const links: Record<string, LinkNoise> = {};
  for (const [key, l] of Object.entries(raw.links ?? {})) {
    b.linkKey(key);
    links[key] = b.link(['links', key], l, defaults.link);
  }
  const nodes: Record<string, NodeNoise> = {};
  for (const [key, n] of Object.entries(raw.nodes ?? {})) {
    if (!NODE_ID_RE.test(key)) ctx.error(['nodes'], { code: 'reference', message: `"${key}" is not a node id`, fix: 'use the node ids of the program set, e.g. "mill"' }, key);
    nodes[key] = {
      memory: b.memory(['nodes', key, 'memory'], n.memory, defaults.memory, key),
      gates: b.gates(['nodes', key, 'gates'], n.gates, defaults.gates),
    };
  }
  const faults = b.faults(raw.faults);
  return { model: { file, text, seed: raw.seed, defaults, links, nodes, faults }, errors: ctx.errors };
}
