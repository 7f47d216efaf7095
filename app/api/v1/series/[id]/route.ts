import { NextResponse } from "next/server";
import { notFound, withActor } from "@/lib/http/respond";
import { getSeriesStatus } from "@/lib/queries/spectrum-status";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/series/{id} — the spectra of a series with their status and key numbers. */
export const GET = withActor<{ params: Promise<{ id: string }> }>(async (_request, { actor, params }) => {
  const { id } = await params;
  const view = await getSeriesStatus(actor, id);
  if (!view) throw notFound(`series ${id.slice(0, 80)}`);
  return NextResponse.json(view, { headers: { "Cache-Control": "no-store" } });
});
