/**
 * Published formulas for the demo checks, written out here independently of the engine.
 * Bell vectors are in bellstep's order [Φ+, Φ−, Ψ+, Ψ−] (docs/physics.md).
 */
export type Bell = [number, number, number, number];

/** A Werner state of fidelity F (common practice). */
export function werner(f: number): Bell {
  const r = (1 - f) / 3;
  return [f, r, r, r];
}

/**
 * One DEJMPS round (Deutsch et al., PRL 77, 2818 (1996)). The paper orders the
 * coefficients A=Φ+, B=Ψ−, C=Ψ+, D=Φ−; converted here at the boundary.
 */
export function dejmps(input: Bell): { p: number; out: Bell } {
  const [A, D, C, B] = input;
  const n = (A + B) ** 2 + (C + D) ** 2;
  return { p: n, out: [(A * A + B * B) / n, (2 * A * B) / n, (C * C + D * D) / n, (2 * C * D) / n] };
}

/** One BBPSSW round on Werner pairs (Bennett et al., PRL 76, 722 (1996)). */
export function bbpssw(f: number): { p: number; f: number } {
  const p = f * f + (2 * f * (1 - f)) / 3 + (5 * (1 - f) ** 2) / 9;
  return { p, f: (f * f + (1 - f) ** 2 / 9) / p };
}

/** Swapping two Werner pairs with perfect operations (Dür, Briegel, Cirac, Zoller, PRA 59, 169 (1999)). */
export function swapWerner(f1: number, f2: number): number {
  return f1 * f2 + ((1 - f1) * (1 - f2)) / 3;
}

/**
 * Swapping two Bell-diagonal pairs with a perfect Bell-state measurement and the
 * teleportation correction: each Bell state is a Pauli error on Φ+ (index = 2x + z in our
 * order), and the errors of the two pairs compose, so the coefficients convolve over XOR
 * (common practice; for Werner inputs it reduces to Dür et al. 1999).
 */
export function swapBell(a: Bell, b: Bell): Bell {
  const c: Bell = [0, 0, 0, 0];
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) c[i ^ j] += a[i] * b[j];
  return c;
}
