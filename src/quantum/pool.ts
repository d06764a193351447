/**
 * Recycled density-matrix buffers. A caller that owns a buffer nobody else can see (one it
 * took from the pool and never handed out as part of a value) may give it back when it is
 * replaced; `take` then reuses it instead of allocating. Only the sizes that occur in a
 * network (up to 5 qubits) are kept, and only a few of each, so the pool stays small.
 */
import { dimOf } from './rho.js';

const KEPT_QUBITS = 5;
const KEPT_PER_SIZE = 32;

export class BufferPool {
  private readonly free: Float64Array[][] = Array.from({ length: KEPT_QUBITS + 1 }, () => []);

  /** A buffer for an n-qubit state (2·4^n numbers); its contents are left over from earlier use. */
  take(n: number): Float64Array {
    if (n <= KEPT_QUBITS) {
      const b = this.free[n].pop();
      if (b !== undefined) return b;
    }
    const dim = dimOf(n);
    return new Float64Array(2 * dim * dim);
  }

  /** Gives back a buffer that nothing refers to any more. */
  give(buf: Float64Array): void {
    // 2·4^n numbers: n from the length
    const n = (31 - Math.clz32(buf.length >> 1)) >> 1;
    if (n <= KEPT_QUBITS && buf.length === 2 * dimOf(n) * dimOf(n)) {
      const list = this.free[n];
      if (list.length < KEPT_PER_SIZE) list.push(buf);
    }
  }
}
