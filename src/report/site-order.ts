/** The order in which pictures lay out the sites: along the chain when the network is one, else as the file lists them. */
import type { Net } from '../engine/index.js';

/** Sites in network order: a chain from the end the file names first, otherwise the program set's order. */
export function siteOrder(net: Net): string[] {
  return chainOrder(net) ?? net.programSet.nodes.map((n) => n.id);
}

/** The sites of a chain in order from the end the file names first, or undefined when the network is not a chain. */
export function chainOrder(net: Net): string[] | undefined {
  const declared = net.programSet.nodes.map((n) => n.id);
  if (declared.length < 2 || net.links.size !== declared.length - 1) return undefined;
  const nbrs = new Map<string, string[]>(declared.map((id) => [id, []]));
  for (const { def } of net.links.values()) {
    if (def.ends[0] === def.ends[1]) return undefined;
    nbrs.get(def.ends[0])?.push(def.ends[1]);
    nbrs.get(def.ends[1])?.push(def.ends[0]);
  }
  for (const list of nbrs.values()) if (list.length === 0 || list.length > 2) return undefined;
  const start = declared.find((id) => nbrs.get(id)!.length === 1);
  if (start === undefined) return undefined;
  const order = [start];
  let prev = '';
  let cur = start;
  for (;;) {
    const next = nbrs.get(cur)!.find((n) => n !== prev);
    if (next === undefined) break;
    order.push(next);
    prev = cur;
    cur = next;
  }
  return order.length === declared.length ? order : undefined;
}
