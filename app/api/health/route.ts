import { NextResponse } from "next/server";
import { checkServicesCached } from "@/lib/health";

export const dynamic = "force-dynamic";

// Public on purpose: load balancers and the start script call it without a session.
// It names services and their state, nothing about the lab's data.
export async function GET() {
  const { services, checkedAt } = await checkServicesCached();
  const allUp = Object.values(services).every((s) => s.status === "up");
  return NextResponse.json(
    { status: allUp ? "up" : "degraded", services, checkedAt },
    { status: allUp ? 200 : 503, headers: { "cache-control": "no-store" } },
  );
}
