import { NextResponse } from "next/server";
import { withActor } from "@/lib/http/respond";
import { listReviewQueue } from "@/lib/queries/review";
import { leadGroupIds } from "@/lib/auth/access";
import { queryObject, queueQuerySchema } from "@/lib/review/schemas";
import { Refusal } from "@/lib/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/review/queue — signatures for the caller to review (group leads), filtered, sorted and paged by keyset (`after`). */
export const GET = withActor(async (request, { actor }) => {
  if (leadGroupIds(actor).length === 0) throw new Refusal(403, "forbidden", "The review queue is for group leads.");
  const query = queueQuerySchema.parse(queryObject(new URL(request.url).searchParams));
  const url = new URL(request.url);
  const queue = await listReviewQueue(actor, query);
  const nextParams = new URLSearchParams(url.searchParams);
  if (queue.next) nextParams.set("after", queue.next);
  return NextResponse.json(
    {
      items: queue.items,
      total: queue.total,
      totalExact: queue.totalExact,
      pageSize: queue.pageSize,
      next: queue.next,
      nextUrl: queue.next ? `/api/v1/review/queue?${nextParams.toString()}` : null,
    },
    { headers: { "Cache-Control": "no-store" } },
  );
});
