import { notFound, withActor } from "@/lib/http/respond";
import { canReadProject, canReadSeries } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { streamBundle } from "@/lib/stewardship/exportBundle";
import { Project, Series } from "@/models";
import { isUuid } from "@/lib/ids";
import { Refusal } from "@/lib/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/exports/{project|series}/{id} — the export bundle (zip), for anyone who may read it. */
export const GET = withActor<{ params: Promise<{ type: string; id: string }> }>(async (_request, { actor, params }) => {
  const { type, id } = await params;
  if (type !== "project" && type !== "series") throw new Refusal(400, "invalid", "type: use project or series.", "type");
  if (!isUuid(id)) throw notFound(`${type} ${id.slice(0, 80)}`);
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
  const bundle = await streamBundle({ type, id }, actor.email);
  // the zip is written while it is sent (lib/stewardship/exportBundle.ts); the audit event follows its last byte
  void bundle.done
    .then(({ manifest, bytes }) =>
      recordAudit({
        actorId: actor.id,
        actorLabel: actor.email,
        groupId,
        action: "exported",
        targetType: type,
        targetId: id,
        details: { files: manifest.files.length, bytes },
      }),
    )
    .catch(() => {});
  const chunks = bundle.chunks;
  const body = new ReadableStream<Uint8Array>({
    async pull(controller) {
      const next = await chunks.next();
      if (next.done) controller.close();
      else controller.enqueue(next.value);
    },
    async cancel() {
      await chunks.return(undefined);
    },
  });
  return new Response(body, {
    status: 200,
    headers: {
      "Content-Type": "application/zip",
      "Content-Disposition": `attachment; filename="${bundle.fileName}"`,
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
