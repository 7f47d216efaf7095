import { NextResponse } from "next/server";
import { notFound, withActor } from "@/lib/http/respond";
import { getSpectrumStatus } from "@/lib/queries/spectrum-status";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/spectra/{id} — status, the latest analysis (peaks, flags, error) and the list of runs. */
export const GET = withActor<{ params: Promise<{ id: string }> }>(async (_request, { actor, params }) => {
  const { id } = await params;
  const view = await getSpectrumStatus(actor, id);
  if (!view) throw notFound(`spectrum ${id.slice(0, 80)}`);
  return NextResponse.json(view, { headers: { "Cache-Control": "no-store" } });
});
