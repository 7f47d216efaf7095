/**
 * The one refusal of the app: what was refused, as an HTTP status, a stable code, a one-line
 * message that names the file or field, and the field it concerns. Route handlers answer it
 * through `errorResponse()` (lib/http/respond.ts) as `{ error: { code, message, field } }` with
 * the status; server actions through `protectedAction()` (lib/actions/protected.ts) as a message
 * beside the field. Library code throws it; nobody maps it into another class.
 */
export class Refusal extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
  ) {
    super(message.replace(/[\r\n]+/g, " "));
    this.name = "Refusal";
  }
}

/** The code each common status gets when the caller names none. */
export type RefusalStatus = 400 | 403 | 404 | 409;
const CODE_OF_STATUS: Record<RefusalStatus, string> = { 400: "invalid", 403: "forbidden", 404: "not-found", 409: "conflict" };

/** A refusal with the usual code for its status (400 invalid, 403 forbidden, 404 not-found, 409 conflict). */
export function refuse(status: RefusalStatus, message: string, field?: string): Refusal {
  return new Refusal(status, CODE_OF_STATUS[status], message, field);
}
