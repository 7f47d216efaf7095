import { NextResponse } from "next/server";
import { withActor } from "@/lib/http/respond";
import { listReviewQueue, leadGroupIds } from "@/lib/queries/review";
import { queryObject, queueQuerySchema } from "@/lib/review/schemas";
import { Refusal } from "@/lib/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/review/queue — signatures for the caller to review (group leads), filtered, sorted and paged. */
export const GET = withActor(async (request, { actor }) => {
  if (leadGroupIds(actor).length === 0) throw new Refusal(403, "forbidden", "The review queue is for group leads.");
  const query = queueQuerySchema.parse(queryObject(new URL(request.url).searchParams));
  const queue = await listReviewQueue(actor, query);
  return NextResponse.json(
    { items: queue.items, total: queue.total, totalExact: queue.totalExact, page: queue.page, pageSize: queue.pageSize, pages: queue.pages },
    { headers: { "Cache-Control": "no-store" } },
  );
});
