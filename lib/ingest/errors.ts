/**
 * A refusal of an upload or request, with the HTTP status it maps to, a stable code and
 * a one-line message that names the file or field. Never wraps a database error text.
 */
export class IngestError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
  ) {
    super(message.replace(/[\r\n]+/g, " "));
    this.name = "IngestError";
  }
}
