/** Thrown when a match run is cancelled through its `AbortSignal`. */
export class MatchCancelledError extends Error {
  constructor(message = 'The cross-match was cancelled before it finished.') {
    super(message);
    this.name = 'MatchCancelledError';
  }
}

/**
 * Thrown for invalid catalogs or parameters; the message names the catalog, the field, the row
 * (0-based index into the arrays) and the offending value.
 */
export class MatchInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'MatchInputError';
  }
}
