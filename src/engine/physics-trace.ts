/**
 * A record of the density-matrix work a run does, so that a benchmark can time the physics
 * alone: the same kernel calls, in the same order, on the same sizes and values, with no
 * interpreter and no bookkeeping around them. Recording is off unless a trace is installed;
 * each kernel call site then costs one test.
 */
import {
  BufferPool,
  bellCoefficients,
  depolarize1InPlace,
  depolarize2InPlace,
  gateKernel,
  GATE_NAMES,
  keepQubitsInto,
  measureInto,
  memoryDecayInPlace,
  tensorInto,
  type Basis,
  type GateName,
} from '../quantum/index.js';

const enum Op {
  Copy = 1,
  Decay,
  Tensor,
  Gate,
  Dep1,
  Dep2,
  Measure,
  Keep,
  Bell,
  Free,
}

const BASES: readonly Basis[] = ['z', 'x', 'y'];

/** The kernel calls of a run, as registers (one per buffer) and operations on them. */
export class PhysicsTrace {
  /** Operations, flattened: a code, then its arguments. */
  readonly ops: number[] = [];
  /** Contents of the buffers first seen as inputs (the links' fresh pair states). */
  readonly inputs = new Map<number, Float64Array>();
  private readonly regs = new WeakMap<Float64Array, number>();
  private next = 0;
  /** Operations recorded. */
  count = 0;

  /** The register of a buffer; a buffer first seen as an input has its contents kept. */
  reg(buf: Float64Array, input = false): number {
    let r = this.regs.get(buf);
    if (r === undefined) {
      r = this.next++;
      this.regs.set(buf, r);
      if (input) this.inputs.set(r, buf.slice());
    }
    return r;
  }

  /** Appends one operation. */
  op(...args: number[]): void {
    this.count++;
    for (const a of args) this.ops.push(a);
  }
}

/** The trace being recorded, if any. */
export let trace: PhysicsTrace | null = null;

/** Starts (or, with null, stops) recording kernel calls. */
export function recordPhysics(t: PhysicsTrace | null): void {
  trace = t;
}

/** Encoders used by the engine's kernel call sites (only while a trace is installed). */
export const traced = {
  copy(t: PhysicsTrace, dst: Float64Array, src: Float64Array, n: number): void {
    t.op(Op.Copy, t.reg(dst), t.reg(src, true), n);
  },
  decay(t: PhysicsTrace, d: Float64Array, n: number, q: number, dt: number, t1?: number, t2?: number): void {
    t.op(Op.Decay, t.reg(d), n, q, dt, t1 ?? -1, t2 ?? -1);
  },
  tensor(t: PhysicsTrace, out: Float64Array, a: Float64Array, na: number, b: Float64Array, nb: number): void {
    t.op(Op.Tensor, t.reg(out), t.reg(a, true), na, t.reg(b, true), nb);
  },
  gate(t: PhysicsTrace, d: Float64Array, n: number, op: GateName, i: number, j: number, theta: number): void {
    t.op(Op.Gate, t.reg(d), n, GATE_NAMES.indexOf(op), i, j, theta);
  },
  dep1(t: PhysicsTrace, d: Float64Array, n: number, q: number, p: number): void {
    t.op(Op.Dep1, t.reg(d), n, q, p);
  },
  dep2(t: PhysicsTrace, d: Float64Array, n: number, i: number, j: number, p: number): void {
    t.op(Op.Dep2, t.reg(d), n, i, j, p);
  },
  measure(t: PhysicsTrace, d: Float64Array, n: number, q: number, basis: Basis, u: number, flip: number, out: Float64Array): void {
    t.op(Op.Measure, t.reg(d), n, q, BASES.indexOf(basis), u, flip, t.reg(out));
  },
  keep(t: PhysicsTrace, src: Float64Array, n: number, keep: readonly number[], out: Float64Array): void {
    t.op(Op.Keep, t.reg(src, true), n, t.reg(out), keep.length, ...keep);
  },
  bell(t: PhysicsTrace, d: Float64Array): void {
    t.op(Op.Bell, t.reg(d, true));
  },
  free(t: PhysicsTrace, d: Float64Array): void {
    t.op(Op.Free, t.reg(d));
  },
};

/**
 * Runs a trace's kernel calls on fresh buffers (taken from and given back to a pool, as the
 * engine does) and returns a number that depends on every result, so nothing is optimised away.
 */
export function replayPhysics(t: PhysicsTrace): number {
  const pool = new BufferPool();
  const bufs: Float64Array[] = [];
  for (const [r, data] of t.inputs) bufs[r] = data;
  const o = t.ops;
  const rho: { n: number; data: Float64Array } = { n: 0, data: new Float64Array(0) };
  const keep: number[] = [];
  const other: { n: number; data: Float64Array } = { n: 0, data: new Float64Array(0) };
  let sink = 0;
  const buf = (r: number, n: number): Float64Array => (bufs[r] ??= pool.take(n));
  for (let k = 0; k < o.length; ) {
    switch (o[k] as Op) {
      case Op.Copy: {
        const n = o[k + 3];
        buf(o[k + 1], n).set(bufs[o[k + 2]]);
        k += 4;
        break;
      }
      case Op.Decay:
        memoryDecayInPlace(bufs[o[k + 1]], o[k + 2], o[k + 3], o[k + 4], o[k + 5] < 0 ? undefined : o[k + 5], o[k + 6] < 0 ? undefined : o[k + 6]);
        k += 7;
        break;
      case Op.Tensor: {
        rho.n = o[k + 3];
        rho.data = bufs[o[k + 2]];
        other.n = o[k + 5];
        other.data = bufs[o[k + 4]];
        tensorInto(rho, other, buf(o[k + 1], rho.n + other.n));
        k += 6;
        break;
      }
      case Op.Gate:
        gateKernel(bufs[o[k + 1]], o[k + 2], GATE_NAMES[o[k + 3]], o[k + 4], o[k + 5], o[k + 6]);
        k += 7;
        break;
      case Op.Dep1:
        depolarize1InPlace(bufs[o[k + 1]], o[k + 2], o[k + 3], o[k + 4]);
        k += 5;
        break;
      case Op.Dep2:
        depolarize2InPlace(bufs[o[k + 1]], o[k + 2], o[k + 3], o[k + 4], o[k + 5]);
        k += 6;
        break;
      case Op.Measure: {
        const n = o[k + 2];
        const r = measureInto(bufs[o[k + 1]], n, o[k + 3], BASES[o[k + 4]], o[k + 5], o[k + 6], buf(o[k + 7], n - 1));
        sink += r.bit;
        k += 8;
        break;
      }
      case Op.Keep: {
        const m = o[k + 4];
        keep.length = m;
        for (let i = 0; i < m; i++) keep[i] = o[k + 5 + i];
        rho.n = o[k + 2];
        rho.data = bufs[o[k + 1]];
        keepQubitsInto(rho, keep, buf(o[k + 3], m));
        k += 5 + m;
        break;
      }
      case Op.Bell:
        rho.n = 2;
        rho.data = bufs[o[k + 1]];
        sink += bellCoefficients(rho)[0];
        k += 2;
        break;
      case Op.Free: {
        const r = o[k + 1];
        pool.give(bufs[r]);
        bufs[r] = undefined as unknown as Float64Array;
        k += 2;
        break;
      }
      default:
        throw new Error(`physics trace: unknown operation ${o[k]} at ${k}`);
    }
  }
  return sink;
}
