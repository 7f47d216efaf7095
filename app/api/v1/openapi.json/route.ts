import { NextResponse } from "next/server";
import { withActor } from "@/lib/http/respond";
import { openApiDocument } from "@/lib/http/openapi";

export const runtime = "nodejs";

/** GET /api/v1/openapi.json — OpenAPI 3.1 description of the scripts' API. */
export const GET = withActor(async () => NextResponse.json(openApiDocument()));
