/**
 * The full events of the recent past, for the timeline. The session keeps one line per
 * event; this keeps the last `capacity` whole events (sends, fires, deliveries) as the
 * session computes them, by listening to its history. Older events fall back to their
 * one-line record, so the timeline shows them without arrows.
 */
import type { EngineEvent } from '../engine/index.js';
import type { Session } from '../session/session.js';

export class EventLog {
  private readonly ring: (EngineEvent | undefined)[];

  constructor(
    readonly session: Session,
    readonly capacity = 8192,
  ) {
    this.ring = new Array(capacity);
    const h = session.history;
    const before = h.onNewEvent;
    h.onNewEvent = (ev, w) => {
      before?.(ev, w);
      this.ring[ev.index % this.capacity] = ev;
    };
  }

  /** The whole event with this index, when it is still held. */
  get(index: number): EngineEvent | undefined {
    if (index < 0) return undefined;
    const ev = this.ring[index % this.capacity];
    if (ev && ev.index === index) return ev;
    // the event at the cursor is always known, even after a jump far back
    const at = this.session.event();
    return at && at.index === index ? at : undefined;
  }
}
