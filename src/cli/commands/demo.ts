/**
 * `bellstep demo [NAME]`: lists the bundled scenarios, or opens one in the debugger. Each
 * scenario is a folder `demos/<name>/` with one `*.net.yaml`, one `*.noise.yaml` and a
 * README.md whose first line is `# Title` and whose first paragraph is a one-line summary.
 * The folder is found next to the installed package, not in the working directory.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadText } from '../../api/inputs.js';
import { parseSeed } from '../inputs.js';
import { EXIT, type CommandSpec } from '../spec.js';
import { openDebugger, parseRate } from './debug.js';

export interface DemoInfo {
  readonly name: string;
  readonly dir: string;
  readonly title: string;
  readonly summary: string;
  readonly net?: string;
  readonly noise?: string;
}

/** The bundled demos folder: `demos/` at the package root (two levels above src/cli/commands or dist/cli/commands). */
export function demosDir(): string {
  return fileURLToPath(new URL('../../../demos/', import.meta.url));
}

/** Title and one-line summary from a README: `# Title`, then the first paragraph. */
export function readmeInfo(text: string): { title?: string; summary?: string } {
  const lines = text.split(/\r?\n/);
  const first = lines.findIndex((l) => l.trim() !== '');
  const title = first >= 0 && /^#\s+/.test(lines[first]) ? lines[first].replace(/^#\s+/, '').trim() : undefined;
  const para: string[] = [];
  for (const l of lines.slice(first + 1)) {
    if (l.trim() === '') {
      if (para.length) break;
      continue;
    }
    if (/^#/.test(l)) break;
    para.push(l.trim());
  }
  return { title, summary: para.length ? para.join(' ') : undefined };
}

/** Every scenario folder under `dir`, by name. */
export function listDemos(dir = demosDir()): DemoInfo[] {
  if (!existsSync(dir)) return [];
  const out: DemoInfo[] = [];
  for (const ent of readdirSync(dir, { withFileTypes: true })) {
    if (!ent.isDirectory()) continue;
    const d = join(dir, ent.name);
    const files = readdirSync(d);
    const net = files.find((f) => f.endsWith('.net.yaml'));
    const noise = files.find((f) => f.endsWith('.noise.yaml'));
    const readme = files.includes('README.md') ? readmeInfo(readFileSync(join(d, 'README.md'), 'utf8')) : {};
    out.push({
      name: ent.name,
      dir: d,
      title: readme.title ?? ent.name,
      summary: readme.summary ?? (net ? '(no README.md yet)' : '(incomplete: no .net.yaml)'),
      net: net && join(d, net),
      noise: noise && join(d, noise),
    });
  }
  return out.sort((a, b) => a.name.localeCompare(b.name));
}

function listing(demos: readonly DemoInfo[]): string {
  const w = Math.max(...demos.map((d) => d.name.length));
  return demos.map((d) => `  ${d.name.padEnd(w)}  ${d.title}\n  ${' '.repeat(w)}  ${d.summary}\n`).join('');
}

export const demoCommand: CommandSpec = {
  name: 'demo',
  args: '[NAME]',
  summary: 'list the bundled scenarios, or open one in the debugger',
  options: [
    { flags: '--seed <S>', description: "seed (overrides the scenario's)" },
    { flags: '--autoplay <RATE>', description: 'teaching mode: step RATE events per second, narrating each (Space pauses)' },
  ],
  async run({ io }, [name], opts) {
    const seed = parseSeed(opts.seed);
    const autoplay = parseRate(opts.autoplay);
    const demos = listDemos();
    if (demos.length === 0) {
      io.stderr(`bellstep: no scenarios found in ${demosDir()}\n  fix: reinstall bellstep; the package ships a demos/ folder\n`);
      return EXIT.input;
    }
    if (name === undefined) {
      io.stdout(`bundled scenarios (open one with: bellstep demo NAME):\n\n${listing(demos)}`);
      return EXIT.ok;
    }
    const demo = demos.find((d) => d.name === name);
    if (!demo) {
      io.stderr(`bellstep: there is no scenario "${name}"; the scenarios are: ${demos.map((d) => d.name).join(', ')}\n`);
      return EXIT.input;
    }
    if (!demo.net) {
      io.stderr(`bellstep: the scenario "${name}" has no .net.yaml in ${demo.dir}\n`);
      return EXIT.input;
    }
    const inputs = loadText({
      programSetFile: demo.net,
      programSet: readFileSync(demo.net, 'utf8'),
      noiseFile: demo.noise,
      noise: demo.noise ? readFileSync(demo.noise, 'utf8') : undefined,
    });
    const hint = `bellstep run ${demo.net}${demo.noise ? ` --noise ${demo.noise}` : ''}`;
    return openDebugger(io, inputs, { breaks: [], autoplay, runHint: hint, seed, inputFiles: [demo.net, demo.noise] });
  },
};
