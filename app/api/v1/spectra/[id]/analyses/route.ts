import { NextResponse } from "next/server";
import { isJson } from "@/lib/http/mediaType";
import { withActor } from "@/lib/http/respond";
import { requestReanalysis } from "@/lib/ingest";
import { Refusal } from "@/lib/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** POST /api/v1/spectra/{id}/analyses — a new analysis run with changed parameters (JSON body); earlier runs are kept. */
export const POST = withActor<{ params: Promise<{ id: string }> }>(async (request, { actor, params }) => {
  const { id } = await params;
  let body: unknown = {};
  const text = await request.text();
  if (text.trim() !== "") {
    if (!isJson(request)) throw new Refusal(415, "unsupported-media-type", "send the parameters as application/json");
    try {
      body = JSON.parse(text);
    } catch {
      throw new Refusal(400, "invalid-body", "the request body is not valid JSON");
    }
  }
  const result = await requestReanalysis(id, body, actor);
  return NextResponse.json(result, { status: result.created ? 201 : 200 });
});
