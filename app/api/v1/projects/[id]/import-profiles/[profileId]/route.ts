import { NextResponse } from "next/server";
import { withActor } from "@/lib/http/respond";
import { deleteImportProfile } from "@/lib/ingest/profiles/importProfiles";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** DELETE /api/v1/projects/{id}/import-profiles/{profileId} — removes a profile (audited); files already stored are not touched. */
export const DELETE = withActor<{ params: Promise<{ id: string; profileId: string }> }>(async (_request, { actor, params }) => {
  const { id, profileId } = await params;
  await deleteImportProfile(actor, id, profileId);
  return new NextResponse(null, { status: 204 });
});
