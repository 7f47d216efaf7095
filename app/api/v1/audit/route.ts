import { forbidden, withActor } from "@/lib/http/respond";
import { stewardGroupIds } from "@/lib/auth/access";
import { auditCsv, auditFilterSchema, listAuditEvents } from "@/lib/queries/audit";
import { Refusal } from "@/lib/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/audit?action&actor&target&from&to&format=csv|json — the audit trail of the groups the caller stewards. */
export const GET = withActor(async (request, { actor }) => {
  if (stewardGroupIds(actor).length === 0) throw forbidden("the audit trail (data stewards only)");
  const params = Object.fromEntries(new URL(request.url).searchParams);
  const format = params.format ?? "json";
  if (format !== "csv" && format !== "json") throw new Refusal(400, "invalid", "format: use csv or json.", "format");
  const filter = auditFilterSchema.parse({ action: params.action, actor: params.actor, target: params.target, from: params.from, to: params.to });
  const rows = await listAuditEvents(actor, { ...filter, limit: 50_000 });
  if (format === "json") return Response.json({ events: rows }, { headers: { "Cache-Control": "private, no-store" } });
  return new Response(auditCsv(rows), {
    status: 200,
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="bandkeep-audit-${new Date().toISOString().slice(0, 10)}.csv"`,
      "Cache-Control": "private, no-store",
    },
  });
});
