/**
 * `npm run bench`: runs every benchmark module, each in a fresh process (so garbage and JIT
 * state from one cannot slow another), and prints its ratios.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { printLines, type BenchLine } from './harness.js';

const modules: Record<string, () => Promise<{ default: () => Promise<BenchLine[]> }>> = {
  'quantum kernel vs mathjs': () => import('./kernel.bench.js'),
  'expression evaluation': () => import('./expr.bench.js'),
  'debugger frame': () => import('./render.bench.js'),
  'engine': () => import('./engine.bench.js'),
  'session': () => import('./session.bench.js'),
  'sweep': () => import('./sweep.bench.js'),
};

const child = process.argv.indexOf('--child');
if (child >= 0) {
  const title = process.argv[child + 1];
  const lines = await (await modules[title]()).default();
  printLines(title, lines);
  process.exitCode = lines.some((l) => !l.ok) ? 10 + lines.filter((l) => !l.ok).length : 0;
} else {
  const only = process.argv[2];
  let missed = 0;
  for (const title of Object.keys(modules)) {
    if (only && !title.includes(only)) continue;
    const r = spawnSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), '--child', title], { stdio: 'inherit' });
    if (r.status !== null && r.status >= 10) missed += r.status - 10;
    else if (r.status !== 0) {
      console.log(`benchmark "${title}" failed (exit ${r.status ?? r.signal})`);
      missed++;
    }
  }
  console.log(`\n${missed === 0 ? 'all goals met' : `${missed} goal(s) missed`}`);
}
