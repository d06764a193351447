/**
 * Delivery records, kept as an immutable list that grows at the head: appending never
 * copies earlier records, so worlds in the history share them all, and the count and the
 * lowest fidelity so far are read in constant time.
 */
import type { DeliveryRecord, World } from './types.js';

/** A cell of the delivery list: the newest record and everything before it. */
export interface DeliveredCell {
  readonly record: DeliveryRecord;
  readonly prev: DeliveredCell | null;
  readonly count: number;
  readonly minFidelity: number;
}

/** Appends a delivery to a (draft) world. */
export function addDelivery(w: World, record: DeliveryRecord): void {
  const prev = w.delivered;
  w.delivered = {
    record,
    prev,
    count: (prev?.count ?? 0) + 1,
    minFidelity: Math.min(prev?.minFidelity ?? 1, record.fidelity),
  };
}

/** Number of pairs delivered so far. */
export function deliveredCount(w: World): number {
  return w.delivered?.count ?? 0;
}

/** Every delivery record, oldest first. */
export function deliveries(w: World): DeliveryRecord[] {
  const out: DeliveryRecord[] = [];
  for (let c = w.delivered; c; c = c.prev) out.push(c.record);
  return out.reverse();
}

/** The newest delivery records first, visiting at most `limit`. */
export function* recentDeliveries(w: World, limit = Infinity): Generator<DeliveryRecord> {
  let n = 0;
  for (let c = w.delivered; c && n < limit; c = c.prev, n++) yield c.record;
}
