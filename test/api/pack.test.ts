/**
 * The package as a user gets it: the sources are compiled with declarations, packed with
 * `npm pack`, and installed from the tarball into a fresh project. There, `run` imported from
 * 'bellstep' prints the same bytes as the installed `bellstep run --json`, only the public
 * names are exported, deep imports are refused, and the types check a caller's code.
 */
import { spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = resolve(import.meta.dirname, '../..');
const tmp = mkdtempSync(join(tmpdir(), 'bellstep-pack-'));
const pkg = join(tmp, 'pkg');
const proj = join(tmp, 'proj');
const env = { ...process.env, NODE_OPTIONS: '' };
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function sh(cmd: string, args: string[], cwd: string): SpawnSyncReturns<string> {
  const r = spawnSync(cmd, args, { cwd, env, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.error) throw r.error;
  return r;
}

function ok(cmd: string, args: string[], cwd: string): string {
  const r = sh(cmd, args, cwd);
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed (${r.status}):\n${r.stdout}\n${r.stderr}`);
  return r.stdout;
}

const NET = 'node_modules/bellstep/demos/two-site-purification/purify.net.yaml';
const NOISE = 'node_modules/bellstep/demos/two-site-purification/purify.noise.yaml';

beforeAll(() => {
  mkdirSync(pkg);
  for (const f of ['package.json', 'README.md']) cpSync(join(ROOT, f), join(pkg, f));
  cpSync(join(ROOT, 'demos'), join(pkg, 'demos'), { recursive: true });
  // the build npm runs on `prepare`, into the folder that is packed
  ok(process.execPath, [join(ROOT, 'node_modules/typescript/bin/tsc'), '-p', join(ROOT, 'tsconfig.build.json'), '--outDir', join(pkg, 'dist')], ROOT);
  const packed = JSON.parse(ok('npm', ['pack', '--json', '--ignore-scripts', '--pack-destination', tmp], pkg)) as { filename: string }[];
  mkdirSync(proj);
  writeFileSync(join(proj, 'package.json'), '{"name": "uses-bellstep", "private": true, "type": "module"}\n');
  ok('npm', ['install', '--prefer-offline', '--no-audit', '--no-fund', join(tmp, packed[0].filename)], proj);
}, 600_000);

describe('the packed package, installed from its tarball', () => {
  it('run through the library equals run --json of the installed command', () => {
    writeFileSync(
      join(proj, 'lib-run.mjs'),
      `import { load, run } from 'bellstep';\n` +
        `const summary = run(load(${JSON.stringify(NET)}, { noise: ${JSON.stringify(NOISE)} }), { seed: 3, until: '8ms', expect: ['delivered() >= 1'] });\n` +
        `process.stdout.write(JSON.stringify(summary, null, 2) + '\\n');\n`,
    );
    const lib = ok(process.execPath, ['lib-run.mjs'], proj);
    const cli = sh(process.execPath, ['node_modules/.bin/bellstep', 'run', NET, '--noise', NOISE, '--seed', '3', '--until', '8ms', '--expect', 'delivered() >= 1', '--json'], proj);
    expect(cli.status).toBe(0);
    expect(JSON.parse(lib).delivered.length).toBeGreaterThan(0);
    expect(lib).toBe(cli.stdout);
  });

  it('exports only the public names, and refuses deep imports', () => {
    const names = ok(process.execPath, ['--input-type=module', '-e', "const m = await import('bellstep'); console.log(Object.keys(m).sort().join(' '))"], proj);
    expect(names.trim()).toBe('InputError check load loadText openSession run sweep');
    const deep = sh(process.execPath, ['--input-type=module', '-e', "await import('bellstep/dist/cli/main.js')"], proj);
    expect(deep.status).not.toBe(0);
    expect(deep.stderr).toContain('ERR_PACKAGE_PATH_NOT_EXPORTED');
  });

  it('ships type declarations that check a caller’s code', () => {
    const tsconfig = {
      compilerOptions: { module: 'nodenext', moduleResolution: 'nodenext', target: 'es2022', strict: true, noEmit: true, skipLibCheck: true, typeRoots: [join(ROOT, 'node_modules/@types')], types: ['node'] },
      include: ['*.ts'],
    };
    writeFileSync(join(proj, 'tsconfig.json'), JSON.stringify(tsconfig));
    const good = `import { InputError, load, run, type RunSummary } from 'bellstep';\n` +
      `try {\n  const s: RunSummary = run(load('x.net.yaml'), { until: '5ms', seed: 1 });\n  const f: number = s.delivered[0].fidelity;\n  console.log(f);\n} catch (e) {\n  if (e instanceof InputError) console.log(e.issues[0].line, e.issues[0].fix);\n}\n`;
    writeFileSync(join(proj, 'caller.ts'), good);
    const tsc = join(ROOT, 'node_modules/typescript/bin/tsc');
    const checked = sh(process.execPath, [tsc, '-p', 'tsconfig.json'], proj);
    expect(checked.stdout + checked.stderr).toBe('');
    expect(checked.status).toBe(0);
    // a wrong option is a type error, so the declarations are not `any`
    writeFileSync(join(proj, 'caller.ts'), `${good}run(load('x.net.yaml'), { until: true });\n`);
    const wrong = sh(process.execPath, [tsc, '-p', 'tsconfig.json'], proj);
    expect(wrong.status).not.toBe(0);
    expect(wrong.stdout).toContain("caller.ts(9,27): error TS2322: Type 'true' is not assignable to type 'string | number | undefined'");
  });

  it('keeps its command working: the bin runs from the installed tarball', () => {
    const help = ok(process.execPath, ['node_modules/.bin/bellstep', '--help'], proj);
    for (const c of ['chart', 'diff', 'run', 'sweep']) expect(help).toContain(c);
    expect(readFileSync(join(proj, 'node_modules/bellstep/package.json'), 'utf8')).toContain('"exports"');
  });
});
