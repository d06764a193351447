/**
 * The whole events (sends, fires, deliveries) around the cursor, for the timeline. The
 * session keeps only compact records; the events a frame needs are recomputed, a stretch at
 * a time, from the nearest keyframe before them, so the timeline always shows the moment the
 * other panes show, however the cursor got there.
 */
import type { EngineEvent } from '../engine/index.js';
import type { Session } from '../session/session.js';

export class EventLog {
  private from = 0;
  private events: EngineEvent[] = [];

  constructor(
    readonly session: Session,
    /** Events recomputed at a time, ending at the one asked for or the cursor. */
    readonly capacity = 2048,
  ) {}

  /** The whole event with this index, when it has been computed. */
  get(index: number): EngineEvent | undefined {
    if (index < 0 || index >= this.session.total) return undefined;
    const i = index - this.from;
    if (i >= 0 && i < this.events.length) return this.events[i];
    // the event at the cursor is always known
    const at = this.session.event();
    if (at && at.index === index) return at;
    const to = Math.min(this.session.total, Math.max(index + 1, this.session.cursor));
    const from = Math.max(0, Math.min(index, to - this.capacity));
    this.events = this.session.history.detailedEvents(from, to);
    this.from = from;
    return this.events[index - from];
  }
}
