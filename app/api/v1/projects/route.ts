import { NextResponse } from "next/server";
import { withActor } from "@/lib/http/respond";
import { listProjectChoices } from "@/lib/queries/projects";
import { toApiError } from "@/lib/ingest/apiErrors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/projects — the projects the caller may upload to. */
export const GET = withActor(async (_request, { actor }) => {
  try {
    return NextResponse.json({ projects: await listProjectChoices(actor, "write") }, { headers: { "Cache-Control": "no-store" } });
  } catch (error) {
    throw toApiError(error);
  }
});
