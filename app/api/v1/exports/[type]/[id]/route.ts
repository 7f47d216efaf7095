import { notFound, withActor } from "@/lib/http/respond";
import { canReadProject, canReadSeries } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { buildBundle } from "@/lib/stewardship/exportBundle";
import { Project, Series, models } from "@/models";
import { isUuid } from "@/lib/ids";
import { Refusal } from "@/lib/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/exports/{project|series}/{id} — the export bundle (zip), for anyone who may read it. */
export const GET = withActor<{ params: Promise<{ type: string; id: string }> }>(async (_request, { actor, params }) => {
  const { type, id } = await params;
  if (type !== "project" && type !== "series") throw new Refusal(400, "invalid", "type: use project or series.", "type");
  if (!isUuid(id)) throw notFound(`${type} ${id.slice(0, 80)}`);
  models();
  let groupId: string;
  if (type === "series") {
    const series = await Series.findByPk(id);
    if (!series || !(await canReadSeries(actor, series))) throw notFound(`series ${id}`);
    groupId = (await Project.findByPk(series.projectId))!.groupId;
  } else {
    const project = await Project.findByPk(id);
    if (!project || !(await canReadProject(actor, project))) throw notFound(`project ${id}`);
    groupId = project.groupId;
  }
  const bundle = await buildBundle({ type, id }, actor.email);
  await recordAudit({ actorId: actor.id, actorLabel: actor.email, groupId, action: "exported", targetType: type, targetId: id, details: { files: bundle.manifest.files.length, bytes: bundle.bytes.length } });
  return new Response(new Blob([bundle.bytes as Uint8Array<ArrayBuffer>]), {
    status: 200,
    headers: {
      "Content-Type": "application/zip",
      "Content-Length": String(bundle.bytes.length),
      "Content-Disposition": `attachment; filename="${bundle.fileName}"`,
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
