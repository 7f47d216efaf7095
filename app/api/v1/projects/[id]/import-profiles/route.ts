import { NextResponse } from "next/server";
import { isJson } from "@/lib/http/mediaType";
import { Refusal } from "@/lib/errors";
import { withActor } from "@/lib/http/respond";
import { listImportProfiles, saveImportProfile } from "@/lib/ingest/profiles/importProfiles";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Params = { params: Promise<{ id: string }> };

/** GET /api/v1/projects/{id}/import-profiles — the project's import profiles (people who may upload to it). */
export const GET = withActor<Params>(async (_request, { actor, params }) => {
  const { id } = await params;
  return NextResponse.json({ profiles: await listImportProfiles(actor, id) }, { headers: { "Cache-Control": "no-store" } });
});

/** POST /api/v1/projects/{id}/import-profiles — save a named profile `{name, choice, signature}` (a name saved again is replaced). */
export const POST = withActor<Params>(async (request, { actor, params }) => {
  const { id } = await params;
  if (!isJson(request)) throw new Refusal(415, "unsupported-media-type", "send the profile as application/json");
  let body: unknown;
  try {
    body = JSON.parse(await request.text());
  } catch {
    throw new Refusal(400, "invalid-body", "the request body is not valid JSON");
  }
  const { profile, created } = await saveImportProfile(actor, id, body);
  return NextResponse.json({ profile }, { status: created ? 201 : 200 });
});
