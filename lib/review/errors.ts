/** A refusal of a review request, with the HTTP status it maps to and the field it concerns. */
export class ReviewRefused extends Error {
  constructor(readonly status: 400 | 403 | 404 | 409, message: string, readonly field?: string) {
    super(message);
  }
}
