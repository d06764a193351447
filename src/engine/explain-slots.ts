/**
 * The cause behind many stalls: a link makes no new pairs because every slot at one of its
 * ends is held. Said with the full link id, the end, and what holds each slot: the pair, its
 * stage and since when it is in that stage, so that the held pair that should have moved on
 * can be named.
 */
import { linkId } from '../model/load-program.js';
import { formatDuration } from '../model/units.js';
import type { Net } from './net.js';
import type { World } from './types.js';

/** What holds the slots of one end of a link: `kiln~weir#1 in stage "waiting" since 290 us`. */
function holders(w: World, node: string, link: string): string[] {
  const out: string[] = [];
  for (const p of w.nodes[node].pairs) {
    if (p.link === link) out.push(`${p.id} in stage "${p.stage}" since ${formatDuration(p.entered)}`);
  }
  return out;
}

/**
 * Why the link between `node` and `partner` makes no new pairs, when every slot at one of its
 * ends is held; undefined when there is no such link, or it can still make pairs.
 */
export function slotStarvation(net: Net, w: World, node: string, partner: string): string | undefined {
  const id = linkId(node, partner);
  const info = net.links.get(id);
  const state = w.links[id];
  if (!info || !state || state.generating) return undefined;
  const slots = info.def.slots;
  const full = info.def.ends.filter((end) => state.used[end] >= slots);
  if (full.length === 0) return undefined;
  const ends = full.map((end) => {
    const held = holders(w, end, id);
    return `every slot at ${end} is held (${slots} of ${slots}${held.length ? `: ${held.join(', ')}` : ''})`;
  });
  return `link ${id} makes no new pairs: ${ends.join(', and ')}`;
}
