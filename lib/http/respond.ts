import { NextResponse } from "next/server";
import { ZodError } from "zod";
import { Refusal } from "@/lib/errors";
import { isTransientFault } from "@/lib/transientFault";
import type { Actor } from "@/lib/auth/actor";
import { actorFromRequest } from "@/lib/auth/actor";
import { crossSiteWrite } from "./sameOrigin";

// One error shape for the whole HTTP API:
// { "error": { "code": "not-found", "message": "…", "field": "sampleId" } }

export const unauthenticated = () => new Refusal(401, "unauthenticated", "Sign in or send a Bearer API token.");
export const forbidden = (what = "this") => new Refusal(403, "forbidden", `You do not have access to ${what}.`);
export const notFound = (what: string) => new Refusal(404, "not-found", `${what} was not found.`);

/** A refusal as its status and body; a zod error as 400; a service fault as 503; anything else as 500 (logged). */
export function errorResponse(error: unknown): NextResponse {
  if (error instanceof Refusal) {
    return NextResponse.json(
      { error: { code: error.code, message: error.message, ...(error.field ? { field: error.field } : {}) } },
      { status: error.status },
    );
  }
  if (error instanceof ZodError) {
    const first = error.issues[0];
    const field = first?.path.join(".") || undefined;
    return NextResponse.json(
      { error: { code: "invalid", message: first ? `${field ? `${field}: ` : ""}${first.message}` : "Invalid input.", field } },
      { status: 400 },
    );
  }
  if (isTransientFault(error)) {
    return NextResponse.json(
      { error: { code: "unavailable", message: "A service Bandkeep depends on is not reachable right now. Try again shortly." } },
      { status: 503 },
    );
  }
  console.error(error);
  return NextResponse.json({ error: { code: "internal", message: "Something went wrong on our side. Try again." } }, { status: 500 });
}

type Handler<C> = (request: Request, context: C & { actor: Actor }) => Promise<Response>;

/** Wraps a route handler: resolves the caller first, refuses anonymous calls, maps errors. */
export function withActor<C>(handler: Handler<C>) {
  return async (request: Request, context: C): Promise<Response> => {
    try {
      const actor = await actorFromRequest(request);
      if (!actor) throw unauthenticated();
      if (actor.via === "session") {
        const refusal = crossSiteWrite(request);
        if (refusal)
          throw new Refusal(
            403,
            "cross-site",
            `A signed-in write must come from Bandkeep's own pages (${refusal}); scripts send a Bearer API token.`,
          );
      }
      return await handler(request, { ...context, actor });
    } catch (error) {
      return errorResponse(error);
    }
  };
}
