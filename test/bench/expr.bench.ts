/**
 * Expression evaluation speed. The engine evaluates guards after every event, so a guard
 * must cost well under one immer `produce` (the per-event cost ARCHITECTURE.md plans for),
 * the closure compiler must beat a plain tree walk, and `evaluate`'s cache must cost little
 * over calling the compiled function. The hand-written guard shows the remaining distance.
 */
import { produce } from 'immer';
import { baseFunctions, compileExpr, evaluate, makeScope, parseExpr, type Value } from '../../src/expr/index.js';
import { walk } from '../expr/reference-walker.js';
import { formatNs, timePerCall, type BenchLine } from './harness.js';

const GUARD = 'm.bit == 1 && left.age > 1000 && xor(m.data.z, b0) == 0 && left.partner == fen && min(left.age, 5000) < 4000';

interface Bindings {
  m: { bit: number; data: { z: number } };
  left: { age: number; partner: string };
  b0: number;
  fen: string;
}

export default async (): Promise<BenchLine[]> => {
  const bindings: Bindings = { m: { bit: 1, data: { z: 1 } }, left: { age: 1500, partner: 'fen' }, b0: 1, fen: 'fen' };
  const scope = makeScope(bindings as unknown as Record<string, Value>, baseFunctions);
  const compiled = parseExpr(GUARD);
  const run = compileExpr(compiled);
  const byHand = (b: Bindings): boolean =>
    b.m.bit === 1 && b.left.age > 1000 && (b.m.data.z ^ b.b0) === 0 && b.left.partner === b.fen && Math.min(b.left.age, 5000) < 4000;

  // All four must agree before their speeds are compared.
  const expected = byHand(bindings);
  if (run(scope) !== expected || evaluate(compiled, scope) !== expected || walk(compiled.ast, scope) !== expected) {
    throw new Error('benchmark guard gives different results on different paths');
  }

  // Each timed call runs a batch, so the harness's clock reading does not swamp a ~100 ns body.
  const BATCH = 100;
  let sink = 0;
  const batched = (f: () => unknown): number =>
    timePerCall(() => {
      for (let i = 0; i < BATCH; i++) if (f() === true) sink++;
    }) / BATCH;
  const tCompiled = batched(() => run(scope));
  const tEvaluate = batched(() => evaluate(compiled, scope));
  const tWalk = batched(() => walk(compiled.ast, scope));
  const tHand = batched(() => byHand(bindings));
  const tParse = timePerCall(() => {
    if (parseExpr(GUARD).names.length > 0) sink++;
  });
  // A small world of two nodes holding a few pairs each; one event touches one pair.
  const pairsOf = (partner: string) => Array.from({ length: 4 }, (_, i) => ({ id: `${partner}#${i}`, partner, stage: 'link', age: i }));
  let world = { time: 0, nodes: { quay: { pairs: pairsOf('mill') }, mill: { pairs: pairsOf('quay') } } };
  const tProduce = timePerCall(() => {
    world = produce(world, (d) => {
      d.time += 1;
      d.nodes.quay.pairs[0].age += 1;
    });
  });
  if (sink === 0) throw new Error('benchmark results were optimised away');

  const walkRatio = tWalk / tCompiled;
  const cacheRatio = tCompiled / tEvaluate;
  const handRatio = tCompiled / tHand;
  const parseRatio = tParse / tCompiled;
  const produceRatio = tProduce / tEvaluate;
  return [
    { name: 'one immer produce vs one 5-part guard (produce time / evaluate time)', ratio: produceRatio, goal: '>= 5x', ok: produceRatio >= 5, detail: `produce ${formatNs(tProduce)}, guard ${formatNs(tEvaluate)}` },
    { name: 'closures vs tree walk, same guard (walk time / closure time)', ratio: walkRatio, goal: '>= 1.3x', ok: walkRatio >= 1.3, detail: `closures ${formatNs(tCompiled)}, walk ${formatNs(tWalk)}` },
    { name: 'evaluate() with its cache vs the compiled function (compiled time / evaluate time)', ratio: cacheRatio, goal: '>= 0.7', ok: cacheRatio >= 0.7, detail: `evaluate ${formatNs(tEvaluate)}` },
    { name: 'closures vs the same guard by hand (closure time / hand time)', ratio: handRatio, goal: '<= 200x', ok: handRatio <= 200, detail: `by hand ${formatNs(tHand)}` },
    { name: 'parse once vs evaluate once (parse time / evaluation time)', ratio: parseRatio, goal: '>= 3x', ok: parseRatio >= 3, detail: `parse ${formatNs(tParse)}` },
  ];
};
