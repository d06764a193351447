/** The error of a mistyped or impossible command (its own module, so command handlers in other files can throw it). */

/** A mistyped or impossible command, with a suggestion. */
export class CommandError extends Error {
  constructor(
    message: string,
    readonly fix?: string,
  ) {
    super(message);
    this.name = 'CommandError';
  }
}
