/**
 * `npm run docs`: rewrites the generated sections of every page in docs/ from the tables
 * that drive the code. With `--check`, only says which pages differ (exit 1).
 */
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { renderDocs } from './render.js';

const docs = fileURLToPath(new URL('../../../docs/', import.meta.url));
const check = process.argv.includes('--check');
let stale = 0;
for (const name of readdirSync(docs).filter((f) => f.endsWith('.md')).sort()) {
  const path = join(docs, name);
  const text = readFileSync(path, 'utf8');
  const next = renderDocs(text);
  if (next === text) continue;
  stale++;
  if (check) process.stdout.write(`docs/${name} differs from the tables; run npm run docs\n`);
  else {
    writeFileSync(path, next);
    process.stdout.write(`docs/${name} rewritten\n`);
  }
}
process.exitCode = check && stale > 0 ? 1 : 0;
