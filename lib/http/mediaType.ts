/**
 * The request's media type, exactly: the Content-Type's type/subtype before any parameter,
 * lower-cased (RFC 9110 §8.3.1). "text/plain; application/json" is text/plain, so a
 * cross-site form or fetch that needs no CORS preflight cannot pass as JSON.
 */
export function mediaTypeOf(request: Request): string {
  const header = request.headers.get("content-type") ?? "";
  return header.split(";", 1)[0]!.trim().toLowerCase();
}

export const isJson = (request: Request) => mediaTypeOf(request) === "application/json";
