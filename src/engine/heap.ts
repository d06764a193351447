/**
 * Binary min-heap over (time, seq), in place on an array. The array may be an immer
 * draft: entries are frozen and never mutated, only moved.
 */
export interface Timed {
  readonly time: number;
  readonly seq: number;
}

function before(a: Timed, b: Timed): boolean {
  return a.time < b.time || (a.time === b.time && a.seq < b.seq);
}

/** Adds an entry. */
export function heapPush<T extends Timed>(heap: T[], item: T): void {
  let i = heap.length;
  heap.push(item);
  while (i > 0) {
    const parent = (i - 1) >> 1;
    const p = heap[parent];
    if (!before(item, p)) break;
    heap[i] = p;
    i = parent;
  }
  heap[i] = item;
}

/** Removes and returns the earliest entry, or undefined when empty. */
export function heapPop<T extends Timed>(heap: T[]): T | undefined {
  const n = heap.length;
  if (n === 0) return undefined;
  const top = heap[0];
  const last = heap.pop() as T;
  if (n === 1) return top;
  const size = n - 1;
  let i = 0;
  for (;;) {
    const l = 2 * i + 1;
    if (l >= size) break;
    const r = l + 1;
    let c = l;
    let child = heap[l];
    if (r < size) {
      const rc = heap[r];
      if (before(rc, child)) {
        c = r;
        child = rc;
      }
    }
    if (!before(child, last)) break;
    heap[i] = child;
    i = c;
  }
  heap[i] = last;
  return top;
}
