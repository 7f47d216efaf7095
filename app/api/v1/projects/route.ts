import { NextResponse } from "next/server";
import { withActor } from "@/lib/http/respond";
import { listProjectChoices } from "@/lib/queries/projects";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/projects — the projects the caller may upload to. */
export const GET = withActor(async (_request, { actor }) => {
  return NextResponse.json({ projects: await listProjectChoices(actor, "write") }, { headers: { "Cache-Control": "no-store" } });
});
