import { z } from "zod";
import { forbidden, withActor } from "@/lib/http/respond";
import { refuse } from "@/lib/errors";
import { stewardGroupIds } from "@/lib/auth/access";
import { AUDIT_API_MAX_PAGE, AUDIT_PAGE_SIZE, auditCsvStream, auditFilterSchema, listAuditJson } from "@/lib/queries/audit";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const formatSchema = z.object({
  format: z.enum(["csv", "json"], { error: "format: use csv or json." }).default("json"),
  limit: z.coerce
    .number({ error: "limit: a whole number." })
    .int("limit: a whole number.")
    .min(1, "limit: at least 1.")
    .max(AUDIT_API_MAX_PAGE, `limit: at most ${AUDIT_API_MAX_PAGE}.`)
    .default(AUDIT_PAGE_SIZE),
});

/**
 * GET /api/v1/audit?category&person&action&from&to&after&limit&format=csv|json — the audit trail of
 * the groups the caller stewards. JSON is one page (newest first) with `next`, the cursor of the
 * following page; CSV is the whole selection, streamed.
 */
export const GET = withActor(async (request, { actor }) => {
  if (stewardGroupIds(actor).length === 0) throw forbidden("the audit trail (data stewards only)");
  const params = Object.fromEntries(new URL(request.url).searchParams);
  const shape = formatSchema.safeParse({ format: params.format || undefined, limit: params.limit || undefined });
  if (!shape.success) throw refuse(400, shape.error.issues[0]!.message, String(shape.error.issues[0]!.path[0] ?? ""));
  const parsed = auditFilterSchema.safeParse(params);
  if (!parsed.success) throw refuse(400, parsed.error.issues[0]!.message, String(parsed.error.issues[0]!.path[0] ?? ""));
  const headers = { "Cache-Control": "private, no-store" };
  if (shape.data.format === "json") return Response.json(await listAuditJson(actor, parsed.data, shape.data.limit), { headers });
  return new Response(auditCsvStream(actor, parsed.data), {
    status: 200,
    headers: {
      ...headers,
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="bandkeep-audit-${new Date().toISOString().slice(0, 10)}.csv"`,
    },
  });
});
