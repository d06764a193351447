/** The layout contract that `bellstep demo` relies on, for every folder under demos/. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DEMO_NAMES, DEMOS_DIR, demoFolders, loadDemo } from './demo-files.js';

/** The title line and the first paragraph of a README, as the demo list reads them. */
function titleAndSummary(readme: string): { title: string; summary: string[] } {
  const lines = readme.split('\n');
  const start = lines.findIndex((l, i) => i > 0 && l.trim() !== '');
  const end = lines.findIndex((l, i) => i > start && l.trim() === '');
  return { title: lines[0], summary: lines.slice(start, end === -1 ? undefined : end) };
}

describe('demos/', () => {
  it('holds the bundled scenarios', () => {
    expect(demoFolders()).toEqual(expect.arrayContaining([...DEMO_NAMES]));
  });

  it('has an index with one line for each folder', () => {
    const index = readFileSync(`${DEMOS_DIR}README.md`, 'utf8');
    expect(index.split('\n')[0]).toMatch(/^# \S/);
    for (const name of demoFolders()) {
      expect(index.split('\n').filter((l) => l.startsWith(`- \`${name}\` — `))).toHaveLength(1);
    }
  });

  for (const name of demoFolders()) {
    describe(name, () => {
      const demo = loadDemo(name);

      it('has exactly one program set, one noise model and a README', () => {
        expect(demo.files.filter((f) => f.endsWith('.net.yaml'))).toEqual([demo.netFile]);
        expect(demo.files.filter((f) => f.endsWith('.noise.yaml'))).toEqual([demo.noiseFile]);
        expect(demo.files).toContain('README.md');
      });

      it('starts its README with "# Title" and a one-line summary paragraph', () => {
        const { title, summary } = titleAndSummary(demo.readme);
        expect(title).toMatch(/^# \S.*\S$/);
        expect(summary).toHaveLength(1);
        expect(summary[0]).not.toMatch(/^(#|-|\*|`|\d+\.)/);
        expect(summary[0].trim().length).toBeGreaterThan(20);
      });

      it('says what to look for beyond the summary', () => {
        const { summary } = titleAndSummary(demo.readme);
        const rest = demo.readme.slice(demo.readme.indexOf(summary[0]) + summary[0].length);
        expect(rest.trim().length).toBeGreaterThan(200);
      });

      it('shows a run command on its own files', () => {
        expect(demo.readme).toContain(`bellstep run demos/${name}/${demo.netFile} --noise demos/${name}/${demo.noiseFile}`);
      });

      it('says its noise figures are demo values, not measurements', () => {
        const comments = demo.noise.split('\n').filter((l) => l.trim().startsWith('#')).join(' ');
        expect(comments).toMatch(/typical demo values/i);
        expect(comments).toMatch(/not measurements/i);
      });
    });
  }
});
