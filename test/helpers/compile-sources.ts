/**
 * The current sources compiled to a folder, laid out as `tsc` lays out dist/ (types
 * stripped by esbuild, one file at a time: a quick stand-in for the build), with
 * node_modules linked beside them, for tests that run the CLI as a compiled child process.
 */
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, relative, resolve } from 'node:path';
import { transformSync } from 'esbuild';

const ROOT = resolve(import.meta.dirname, '../..');

function compileTree(dir: string, out: string): number {
  let n = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) n += compileTree(path, out);
    else if (/\.tsx?$/.test(entry.name)) {
      const { code } = transformSync(readFileSync(path, 'utf8'), { loader: path.endsWith('x') ? 'tsx' : 'ts', format: 'esm', target: 'es2022', jsx: 'automatic', sourcefile: path });
      const target = join(out, relative(join(ROOT, 'src'), path)).replace(/\.tsx?$/, '.js');
      mkdirSync(dirname(target), { recursive: true });
      writeFileSync(target, code);
      n++;
    }
  }
  return n;
}

/** Compiles src/ into a new temporary folder; returns the folder and the number of files. */
export function compileSources(prefix = 'bellstep-compiled-'): { dir: string; files: number } {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  const files = compileTree(join(ROOT, 'src'), dir);
  writeFileSync(join(dir, 'package.json'), '{"type": "module"}\n');
  symlinkSync(join(ROOT, 'node_modules'), join(dir, 'node_modules'), 'dir');
  return { dir, files };
}
