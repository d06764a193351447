/** `npm run bench`: runs every benchmark module and prints its ratios. */
import { printLines, type BenchLine } from './harness.js';

const modules: Record<string, () => Promise<{ default: () => Promise<BenchLine[]> }>> = {
  'quantum kernel vs mathjs': () => import('./kernel.bench.js'),
  'expression evaluation': () => import('./expr.bench.js'),
  'debugger frame': () => import('./render.bench.js'),
  'engine': () => import('./engine.bench.js'),
  'session': () => import('./session.bench.js'),
};

const only = process.argv[2];
let missed = 0;
for (const [title, load] of Object.entries(modules)) {
  if (only && !title.includes(only)) continue;
  const lines = await (await load()).default();
  printLines(title, lines);
  missed += lines.filter((l) => !l.ok).length;
}
console.log(`\n${missed === 0 ? 'all goals met' : `${missed} goal(s) missed`}`);
