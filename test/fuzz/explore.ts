/**
 * The exploring fuzzer behind test/fuzz/demo-mutations.test.ts, for many more cases than a
 * test can afford: it mutates the demos' files, and groups what goes wrong (a crash, a stack
 * trace, a run that refuses what check accepted, a slow case) by its message.
 *   npx tsx test/fuzz/explore.ts CASES FIRST_SEED     (NETSHARE=0.2 mutates noise models more)
 */
import { readFileSync } from 'node:fs';
import { runCli } from '../helpers/run-cli.js';
import { generator, mutate } from './mutate.js';
const demos: [string, string, string][] = [
  ['three-site-swap', 'swap.net.yaml', 'swap.noise.yaml'],
  ['two-site-purification', 'purify.net.yaml', 'purify.noise.yaml'],
  ['stalled-purification', 'stalled.net.yaml', 'stalled.noise.yaml'],
  ['lost-message', 'lost.net.yaml', 'lost.noise.yaml'],
  ['nested-repeater', 'repeater.net.yaml', 'repeater.noise.yaml'],
  ['long-chain', 'chain.net.yaml', 'chain.noise.yaml'],
];
const N = Number(process.argv[2] ?? 200);
// seeds FIRST_SEED .. FIRST_SEED + CASES - 1; a finding names its seed, to replay it
const seed0 = Number(process.argv[3] ?? 1);
const classes = new Map<string, { count: number; example: string }>();
let accepted = 0;
for (let s = seed0; s < seed0 + N; s++) {
  const rnd = generator(s);
  const [dir, netF, noiseF] = demos[s % demos.length];
  const net = readFileSync(`demos/${dir}/${netF}`, 'utf8');
  const noise = readFileSync(`demos/${dir}/${noiseF}`, 'utf8');
  const which = rnd() < Number(process.env.NETSHARE ?? 0.75) ? 'net' : 'noise';
  const m = mutate(which === 'net' ? net : noise, rnd);
  const files = { 'n.net.yaml': which === 'net' ? m.text : net, 'n.noise.yaml': which === 'noise' ? m.text : noise };
  const t0 = Date.now();
  const c = await runCli(['check', 'n.net.yaml', '--noise', 'n.noise.yaml'], files);
  const bad = (why: string, out: string) => {
    const key = why;
    const e = classes.get(key) ?? { count: 0, example: '' };
    e.count++;
    if (!e.example) e.example = `seed ${s} ${dir} ${which}: ${m.what.join('; ')}\n${out.slice(0, 600)}`;
    classes.set(key, e);
  };
  if (c.code === 3 || /\n\s+at /.test(c.stderr)) bad('check crashed', c.stderr);
  if (c.code !== 0) continue;
  accepted++;
  const r = await runCli(['run', 'n.net.yaml', '--noise', 'n.noise.yaml', '--until', '20ms', '--events', '20000'], files);
  const dt = Date.now() - t0;
  if (r.code === 3) bad('run crashed: ' + r.stderr.split('\n')[0].slice(0, 80), r.stderr);
  else if (r.code === 2) bad('run refused what check accepted: ' + r.stderr.split('\n')[0].replace(/^bellstep: \S+ /, '').replace(/[0-9]+/g, 'N').slice(0, 90), r.stderr);
  if (dt > 5000) bad('slow', `${dt} ms`);
}
console.log(`cases ${N}, check accepted ${accepted}`);
for (const [k, v] of [...classes].sort((a, b) => b[1].count - a[1].count)) console.log(`\n=== ${v.count}× ${k}\n${v.example}`);
