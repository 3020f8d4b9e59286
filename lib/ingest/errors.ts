/**
 * What went wrong with an uploaded file as a whole (as opposed to one rejected row). The upload
 * handler maps every code to a 422 response; `details` carries machine-readable context such as
 * the line, the column or the position candidates.
 */
export type IngestFileErrorCode =
  | 'empty-file'
  | 'no-data-rows'
  | 'rejected-row'
  | 'binary-file'
  | 'invalid-encoding'
  | 'wrong-delimiter'
  | 'no-position-columns'
  | 'ambiguous-position-columns'
  | 'duplicate-column'
  | 'unknown-column'
  | 'unknown-unit'
  | 'unclosed-quote'
  | 'line-too-long'
  | 'truncated-votable'
  | 'malformed-xml'
  | 'unsupported-votable';

/** A file-level ingest failure: `code` says what, the message says what and where (line, column, value). */
export class IngestFileError extends Error {
  readonly code: IngestFileErrorCode;
  readonly details: Record<string, unknown> | undefined;

  constructor(code: IngestFileErrorCode, message: string, details?: Record<string, unknown>) {
    super(message);
    this.name = 'IngestFileError';
    this.code = code;
    this.details = details;
  }
}
