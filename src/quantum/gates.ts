/**
 * Unitary gates as U ρ U†. Each gate is one of three shapes: an index permutation
 * (x, cnot, swap), a diagonal phase (z, s, sdg, t, rz, cz), or a 2×2 kernel on the
 * affected blocks (h, y, rx, ry).
 */
import {
  czInPlace,
  flipInPlace,
  involutionInPlace,
  permutationScratch,
  permutedCopy,
  phase1InPlace,
  unitary1InPlace,
} from './blocks.js';
import { H, rx, ry, Y } from './mat2.js';
import { checkDistinct, clone, dimOf, maskOf, type Rho } from './rho.js';

/** Gate names of the `gate` step (docs/format.md). */
export type GateName = 'x' | 'y' | 'z' | 'h' | 's' | 'sdg' | 't' | 'rx' | 'ry' | 'rz' | 'cnot' | 'cz' | 'swap';

const ARITY: Readonly<Record<GateName, 1 | 2>> = {
  x: 1, y: 1, z: 1, h: 1, s: 1, sdg: 1, t: 1, rx: 1, ry: 1, rz: 1, cnot: 2, cz: 2, swap: 2,
};

/** Every gate name, in a stable order. */
export const GATE_NAMES: readonly GateName[] = Object.keys(ARITY) as GateName[];

/** Whether a string names a gate. */
export function isGateName(name: string): name is GateName {
  return Object.prototype.hasOwnProperty.call(ARITY, name);
}

/** Applies a gate to the given qubits (for cnot: [control, target]) and returns the new state. */
export function applyGate(rho: Rho, gate: GateName, qubits: readonly number[], angle?: number): Rho {
  checkGate(rho.n, gate, qubits, angle);
  // Permutations write straight into a fresh array: no copy to undo.
  if (gate === 'cnot') return { n: rho.n, data: permutedCopy(rho.data, rho.n, cnotPermutation(rho.n, qubits[0], qubits[1])) };
  if (gate === 'swap') return { n: rho.n, data: permutedCopy(rho.data, rho.n, swapPermutation(rho.n, qubits[0], qubits[1])) };
  const out = clone(rho);
  applyGateInPlace(out.data, out.n, gate, qubits, angle);
  return out;
}

function checkGate(n: number, gate: GateName, qubits: readonly number[], angle: number | undefined): void {
  if (!isGateName(gate)) {
    throw new Error(`unknown gate "${String(gate)}"; known gates: ${GATE_NAMES.join(' ')}`);
  }
  const arity = ARITY[gate];
  if (qubits.length !== arity) {
    throw new Error(`gate ${gate} acts on ${arity} qubit${arity === 1 ? '' : 's'}, got ${qubits.length}`);
  }
  checkDistinct(n, qubits);
  if ((gate === 'rx' || gate === 'ry' || gate === 'rz') && (angle === undefined || !Number.isFinite(angle))) {
    throw new Error(`gate ${gate} needs a finite angle in radians, got ${String(angle)}`);
  }
}

/** The in-place form of `applyGate`, for callers that have already copied. */
export function applyGateInPlace(
  d: Float64Array,
  n: number,
  gate: GateName,
  qubits: readonly number[],
  angle?: number,
): void {
  checkGate(n, gate, qubits, angle);
  gateKernel(d, n, gate, qubits[0], qubits.length > 1 ? qubits[1] : -1, angle ?? 0);
}

/**
 * The kernel behind `applyGateInPlace`, without its checks: for callers whose gate, qubits
 * (b is the second qubit of a two-qubit gate, else unused) and angle are known to be valid.
 */
export function gateKernel(d: Float64Array, n: number, gate: GateName, a: number, b: number, theta: number): void {
  switch (gate) {
    case 'x':
      return flipInPlace(d, n, a);
    case 'cnot':
      return involutionInPlace(d, n, cnotPermutation(n, a, b));
    case 'swap':
      return involutionInPlace(d, n, swapPermutation(n, a, b));
    // One-qubit diagonal gates diag(φ0, φ1) only need f = φ0·conj(φ1), the global phase drops out.
    case 'z':
      return phase1InPlace(d, n, a, -1, 0);
    case 's':
      return phase1InPlace(d, n, a, 0, -1);
    case 'sdg':
      return phase1InPlace(d, n, a, 0, 1);
    case 't':
      return phase1InPlace(d, n, a, Math.SQRT1_2, -Math.SQRT1_2);
    case 'rz':
      return phase1InPlace(d, n, a, Math.cos(theta), -Math.sin(theta));
    case 'cz':
      return czInPlace(d, n, maskOf(n, a) | maskOf(n, b));
    case 'h':
      return unitary1InPlace(d, n, a, H);
    case 'y':
      return unitary1InPlace(d, n, a, Y);
    case 'rx':
      return unitary1InPlace(d, n, a, rx(theta));
    case 'ry':
      return unitary1InPlace(d, n, a, ry(theta));
  }
}

// Permutations of the cluster sizes that occur (up to 5 qubits) are built once.
const CACHED = 5;
const cnotCache: (Int32Array | undefined)[] = [];

function cnotPermutation(n: number, control: number, target: number): Int32Array {
  const key = (n * CACHED + control) * CACHED + target;
  const cached = n <= CACHED ? cnotCache[key] : undefined;
  if (cached !== undefined) return cached;
  const mc = maskOf(n, control);
  const mt = maskOf(n, target);
  const p = n <= CACHED ? new Int32Array(dimOf(n)) : permutationScratch(n);
  for (let r = 0; r < dimOf(n); r++) p[r] = r & mc ? r ^ mt : r;
  if (n <= CACHED) cnotCache[key] = p;
  return p;
}

function swapPermutation(n: number, a: number, b: number): Int32Array {
  const ma = maskOf(n, a);
  const mb = maskOf(n, b);
  const p = permutationScratch(n);
  for (let r = 0; r < dimOf(n); r++) p[r] = !(r & ma) !== !(r & mb) ? r ^ ma ^ mb : r;
  return p;
}
