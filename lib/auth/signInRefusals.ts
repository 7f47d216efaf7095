/**
 * What the sign-in form may say. authorize() throws only these codes; next-auth passes
 * the thrown message to the browser, so anything else (a database outage's
 * "connect ECONNREFUSED …") is replaced by the generic text and logged on the server.
 */
export const SIGN_IN_REFUSALS = {
  mismatch: "That e-mail and password do not match an account.",
  slowed: "Too many failed attempts from here. Wait a little and try again.",
  locked: "This account is locked after many failed attempts. Its owner has been mailed a link to unlock it.",
  unavailable: "Signing in is not possible right now. Try again in a few minutes.",
} as const;

export type SignInRefusal = keyof typeof SIGN_IN_REFUSALS;

export class SignInRefused extends Error {
  constructor(readonly code: SignInRefusal) {
    super(code);
  }
}
