/** Typed steps from validated YAML: arity, angles, reserved keys and the pairs each step names. */
import type { RuleScope } from './bindings.js';
import type { RuleBuild } from './build-guards.js';
import { BIND_NAME_RE, type RawItem } from './schema-program.js';
import { listWords } from './suggest.js';
import { ANGLE_OPS, TWO_QUBIT_OPS, type Basis, type Expr, type GateOp, type Step } from './types.js';
import type { Path } from './yaml-source.js';

/** Built-in message fields, which `send.data` may not overwrite. */
export const MESSAGE_FIELDS: readonly string[] = ['kind', 'from', 'to', 'pair', 'sent'];
/** Built-in pair-record fields, which `note.set` may not overwrite. */
export const PAIR_FIELDS: readonly string[] = ['id', 'partner', 'stage', 'age', 'born'];

type Raw = Record<string, unknown>;

class StepBuilder {
  constructor(private readonly rb: RuleBuild) {}

  private expr(scope: RuleScope, path: Path, raw: unknown): Expr | undefined {
    if (raw === undefined) return undefined;
    const e = this.rb.ex.expr(path, raw);
    scope.reads(e, path);
    return e;
  }

  private pair(scope: RuleScope, name: string, path: Path): string {
    scope.pair(name, this.rb.ctx.pos(path), path);
    return name;
  }

  /** Values keyed by name (`send.data`, `note.set`), refusing built-in field names. */
  private values(scope: RuleScope, path: Path, raw: Raw | undefined, reserved: readonly string[], owner: string): Record<string, Expr> {
    const out: Record<string, Expr> = {};
    for (const [key, v] of Object.entries(raw ?? {})) {
      if (reserved.includes(key)) {
        this.rb.ctx.error(path, { code: 'schema', message: `"${key}" is a built-in field of ${owner} and cannot be set`, fix: `rename it; the built-in fields are ${listWords(reserved, 'and')}` }, key);
        continue;
      }
      if (!BIND_NAME_RE.test(key)) {
        this.rb.ctx.error(path, { code: 'schema', message: `"${key}" is not a usable field name`, fix: 'use letters, digits and "_" (it is read later as NAME.field)' }, key);
        continue;
      }
      const e = this.expr(scope, [...path, key], v);
      if (e) out[key] = e;
    }
    return out;
  }

  private gate(scope: RuleScope, g: Raw, p: Path) {
    const op = g.op as GateOp;
    const single = typeof g.on === 'string';
    const on = single ? [g.on as string] : (g.on as string[]);
    const arity = TWO_QUBIT_OPS.includes(op) ? 2 : 1;
    if (on.length !== arity) {
      const want = arity === 2 ? 'two qubits, [control, target]' : 'one qubit';
      this.rb.ctx.error([...p, 'on'], { code: 'schema', message: `${op} acts on ${want}, got ${on.length}`, fix: arity === 2 ? 'write "on: [a, b]"' : 'write "on: p" with one pair name' });
    } else if (arity === 2 && on[0] === on[1]) {
      this.rb.ctx.error([...p, 'on'], { code: 'schema', message: `${op} needs two different qubits, got "${on[0]}" twice`, fix: 'name two different pairs' });
    }
    on.forEach((name, i) => this.pair(scope, name, single ? [...p, 'on'] : [...p, 'on', i]));
    let angle: Expr | undefined;
    if (ANGLE_OPS.includes(op)) {
      if (g.angle === undefined) this.rb.ctx.error(p, { code: 'schema', message: `${op} needs "angle" (in radians)`, fix: `add e.g. "angle: 1.5708"` });
      angle = this.expr(scope, [...p, 'angle'], g.angle);
    } else if (g.angle !== undefined) {
      this.rb.ctx.error(p, { code: 'schema', message: `"angle" is only for rx, ry and rz, not ${op}`, fix: 'remove "angle"' }, 'angle');
    }
    return { op, on, angle };
  }

  step(scope: RuleScope, raw: RawItem, path: Path): Step | undefined {
    const ctx = this.rb.ctx;
    const pos = ctx.pos(path);
    if ('if' in raw) {
      const cond = this.expr(scope, [...path, 'if'], raw.if);
      const then = this.list(scope.child(), raw.then as RawItem[], [...path, 'then']);
      const otherwise = this.list(scope.child(), (raw.else as RawItem[] | undefined) ?? [], [...path, 'else']);
      return cond ? { kind: 'if', cond, then, else: otherwise, pos } : undefined;
    }
    const key = Object.keys(raw)[0];
    const p = [...path, key];
    const v = raw[key] as Raw;
    switch (key) {
      case 'gate': {
        const { op, on, angle } = this.gate(scope, v, p);
        return { kind: 'gate', op, on, ...(angle ? { angle } : {}), pos };
      }
      case 'measure': {
        const on = this.pair(scope, v.on as string, [...p, 'on']);
        const as = v.as as string | undefined;
        if (as !== undefined) scope.bind({ name: as, kind: 'bit', by: 'the measure step', pos: ctx.pos([...p, 'as']) }, [...p, 'as']);
        return { kind: 'measure', on, basis: (v.basis as Basis | undefined) ?? 'z', ...(as === undefined ? {} : { as }), pos };
      }
      case 'bell_measure': {
        const on = v.on as [string, string];
        const as = v.as as [string, string];
        if (on[0] === on[1]) ctx.error([...p, 'on'], { code: 'schema', message: `a Bell-state measurement needs two different pairs, got "${on[0]}" twice`, fix: 'name the two pairs to swap' });
        if (as[0] === as[1]) ctx.error([...p, 'as'], { code: 'schema', message: `the two bits need different names, got "${as[0]}" twice`, fix: 'write e.g. "as: [zbit, xbit]"' });
        on.forEach((name, i) => this.pair(scope, name, [...p, 'on', i]));
        as.forEach((name, i) => scope.bind({ name, kind: 'bit', by: 'the bell_measure step', pos: ctx.pos([...p, 'as', i]) }, [...p, 'as', i]));
        return { kind: 'bell_measure', on, as, pos };
      }
      case 'send': {
        const to = this.expr(scope, [...p, 'to'], v.to);
        const pair = this.expr(scope, [...p, 'pair'], v.pair);
        const data = this.values(scope, [...p, 'data'], v.data as Raw | undefined, MESSAGE_FIELDS, 'a message');
        return to ? { kind: 'send', to, msgKind: v.kind as string, ...(pair ? { pair } : {}), data, pos } : undefined;
      }
      case 'stage':
        return { kind: 'stage', pair: this.pair(scope, v.pair as string, [...p, 'pair']), to: v.to as string, pos };
      case 'note': {
        const pair = this.pair(scope, v.pair as string, [...p, 'pair']);
        return { kind: 'note', pair, set: this.values(scope, [...p, 'set'], v.set as Raw, PAIR_FIELDS, 'a pair record'), pos };
      }
      case 'correct': {
        const pair = this.pair(scope, v.pair as string, [...p, 'pair']);
        if (v.x === undefined && v.z === undefined) ctx.error(p, { code: 'schema', message: 'correct needs "x", "z" or both', fix: 'add e.g. "x: xbit, z: zbit"' });
        const x = this.expr(scope, [...p, 'x'], v.x);
        const z = this.expr(scope, [...p, 'z'], v.z);
        return { kind: 'correct', pair, ...(x ? { x } : {}), ...(z ? { z } : {}), pos };
      }
      case 'rebind': {
        const pair = this.pair(scope, v.pair as string, [...p, 'pair']);
        if (v.partner === undefined && v.id === undefined) ctx.error(p, { code: 'schema', message: 'rebind needs "partner", "id" or both', fix: 'add e.g. "partner: m.far, id: m.new_id"' });
        const partner = this.expr(scope, [...p, 'partner'], v.partner);
        const id = this.expr(scope, [...p, 'id'], v.id);
        return { kind: 'rebind', pair, ...(partner ? { partner } : {}), ...(id ? { id } : {}), pos };
      }
      case 'discard':
      case 'deliver':
        return { kind: key, pair: this.pair(scope, raw[key] as string, p), pos };
      case 'log': {
        const parts = this.rb.ex.template(p, raw.log as string);
        if (!parts) return undefined;
        for (const part of parts) if (typeof part !== 'string') scope.reads(part, p);
        return { kind: 'log', parts, pos };
      }
      default:
        return undefined;
    }
  }

  list(scope: RuleScope, raws: readonly RawItem[], path: Path): Step[] {
    const out: Step[] = [];
    raws.forEach((raw, i) => {
      const s = this.step(scope, raw, [...path, i]);
      if (s) out.push(s);
    });
    return out;
  }
}

/** Builds a block of steps; names bound by a step are visible to the steps after it. */
export function buildSteps(rb: RuleBuild, raws: readonly RawItem[], path: Path, scope: RuleScope): Step[] {
  return new StepBuilder(rb).list(scope, raws, path);
}

/** Every name a block of steps binds (including inside branches), for "bound later" messages. */
export function stepBindingSites(raws: readonly RawItem[], path: Path, out: Map<string, { by: string; path: Path }>): void {
  raws.forEach((raw, i) => {
    const p = [...path, i];
    if ('if' in raw) {
      stepBindingSites((raw.then as RawItem[]) ?? [], [...p, 'then'], out);
      stepBindingSites((raw.else as RawItem[] | undefined) ?? [], [...p, 'else'], out);
      return;
    }
    const m = raw.measure as Raw | undefined;
    if (m?.as !== undefined && !out.has(m.as as string)) out.set(m.as as string, { by: 'the measure step', path: [...p, 'measure', 'as'] });
    const b = raw.bell_measure as Raw | undefined;
    if (!b) return;
    (b.as as string[]).forEach((n, j) => {
      if (!out.has(n)) out.set(n, { by: 'the bell_measure step', path: [...p, 'bell_measure', 'as', j] });
    });
  });
}
