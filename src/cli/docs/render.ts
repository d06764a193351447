/**
 * Rewrites the generated sections of a page of docs/: the text between
 * `<!-- generated: NAME -->` and `<!-- end generated: NAME -->` is replaced by what the
 * section's table gives now. Everything else on the page is left as written.
 */
import { SECTIONS } from './tables.js';

const BLOCK = /(<!-- generated: ([a-z-]+) \(npm run docs\) -->\n)([\s\S]*?)(<!-- end generated: \2 -->)/g;

/** The names of the sections a page holds. */
export function sectionNames(text: string): string[] {
  return [...text.matchAll(BLOCK)].map((m) => m[2]);
}

/** The page with every generated section as the tables give it now; an unknown section name throws. */
export function renderDocs(text: string): string {
  return text.replace(BLOCK, (_all, open: string, name: string, _old: string, close: string) => {
    const make = SECTIONS[name];
    if (!make) throw new Error(`docs: no generated section "${name}" (known: ${Object.keys(SECTIONS).join(', ')})`);
    return `${open}${make()}\n${close}`;
  });
}
