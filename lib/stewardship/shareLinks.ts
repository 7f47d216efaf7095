import { randomBytes } from "node:crypto";
import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { hashToken } from "@/lib/auth/actor";
import { canSteward, groupOfTarget, stewardGroupIds } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { selectRows, sequelize } from "@/lib/db";
import { hazardsOf, usesUvOrLaserLight, type HazardFlag } from "@/lib/hazards";
import { Group, Project, Series, Share, Spectrum } from "@/models";
import { isUuid } from "@/lib/ids";
import { refuse } from "@/lib/errors";

// Read-only share links: a random token that names one project or series. Only the
// token's sha256 is stored (shares.link_token_hash); the token itself is shown once.
// Every request through a link looks the share up again, so a revocation or an expiry
// takes effect at the next request — nothing here is cached.

/** 32 random bytes, base64url: 43 characters. */
export const LINK_TOKEN_BYTES = 32;
/** Characters of the token kept (in the audit event) so a steward can tell links apart. */
export const LINK_PREFIX_LENGTH = 6;
/** The longest a link may live; a steward can always revoke it sooner. */
export const MAX_LINK_DAYS = 366;

export type LinkTargetType = "project" | "series";
export type LinkState = "in force" | "revoked" | "expired";

export function newLinkToken(): string {
  return randomBytes(LINK_TOKEN_BYTES).toString("base64url");
}

/** Tokens we issue are base64url; anything else is not looked up at all. */
export function looksLikeLinkToken(token: string): boolean {
  return /^[A-Za-z0-9_-]{32,128}$/.test(token);
}

/** Pure: the state of a link at `now`. Revocation wins over expiry; the expiry instant itself is already expired. */
export function linkStateAt(share: { revokedAt: Date | null; expiresAt: Date | null }, now: Date): LinkState {
  if (share.revokedAt) return "revoked";
  if (share.expiresAt && share.expiresAt.getTime() <= now.getTime()) return "expired";
  return "in force";
}

/** Pure: checks a requested expiry; null means "until revoked". */
export function checkLinkExpiry(expiresAt: Date | null, now: Date): Date | null {
  if (expiresAt === null) return null;
  if (Number.isNaN(expiresAt.getTime())) throw refuse(400, "expiresAt: not a valid date and time.", "expiresAt");
  if (expiresAt.getTime() <= now.getTime()) throw refuse(400, "expiresAt: choose a moment in the future.", "expiresAt");
  if (expiresAt.getTime() > now.getTime() + MAX_LINK_DAYS * 86_400_000) {
    throw refuse(400, `expiresAt: at most ${MAX_LINK_DAYS} days from now.`, "expiresAt");
  }
  return expiresAt;
}

const NOT_FOUND = "shareTarget: not a project or series of a group you steward.";

async function targetName(type: LinkTargetType, id: string): Promise<string> {
  if (type === "project") return (await Project.findByPk(id, { attributes: ["name"] }))?.name ?? "";
  const series = await Series.findByPk(id, { attributes: ["name", "projectId"] });
  if (!series) return "";
  const project = await Project.findByPk(series.projectId, { attributes: ["name"] });
  return `${project?.name ?? ""} / ${series.name}`;
}

export type CreatedLink = {
  shareId: string;
  token: string;
  prefix: string;
  expiresAt: Date | null;
  targetType: LinkTargetType;
  targetId: string;
  label: string;
};

/** A data steward of the owning group creates a link; the token is returned once and never stored. */
export async function createShareLink(
  actor: Actor,
  input: { targetType: LinkTargetType; targetId: string; expiresAt: Date | null },
  now = new Date(),
): Promise<CreatedLink> {
  if (input.targetType !== "project" && input.targetType !== "series")
    throw refuse(400, "shareTarget: choose a project or series.", "shareTarget");
  if (!isUuid(input.targetId)) throw refuse(404, NOT_FOUND, "shareTarget");
  const groupId = await groupOfTarget(input.targetType, input.targetId);
  // Another group's ids and a non-steward's request get the same answer.
  if (!groupId || !canSteward(actor, groupId)) throw refuse(404, NOT_FOUND, "shareTarget");
  const expiresAt = checkLinkExpiry(input.expiresAt, now);
  const token = newLinkToken();
  const prefix = token.slice(0, LINK_PREFIX_LENGTH);
  const label = await targetName(input.targetType, input.targetId);
  const share = await sequelize().transaction(async (transaction) => {
    const row = await Share.create(
      {
        groupId,
        targetType: input.targetType,
        targetId: input.targetId,
        granteeUserId: null,
        linkTokenHash: hashToken(token),
        expiresAt,
        revokedAt: null,
        createdBy: actor.id,
      },
      { transaction },
    );
    await recordAudit(
      {
        actorId: actor.id,
        actorLabel: actor.email,
        groupId,
        action: "share-link-created",
        targetType: input.targetType,
        targetId: input.targetId,
        details: { shareId: row.id, prefix, target: label, expiresAt: expiresAt?.toISOString() ?? null },
      },
      transaction,
    );
    return row;
  });
  return { shareId: share.id, token, prefix, expiresAt, targetType: input.targetType, targetId: input.targetId, label };
}

/** A data steward of the owning group revokes a link; the next request through it is refused. */
export async function revokeShareLink(actor: Actor, shareId: string): Promise<void> {
  if (!isUuid(shareId)) throw refuse(400, "id: not a valid id.", "id");
  await sequelize().transaction(async (transaction) => {
    const share = await Share.findByPk(shareId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!share || share.linkTokenHash === null || !canSteward(actor, share.groupId))
      throw refuse(404, "Not found, or not a link of a group you steward.");
    if (share.revokedAt) throw refuse(400, "This link was already revoked.");
    await share.update({ revokedAt: new Date() }, { transaction });
    await recordAudit(
      {
        actorId: actor.id,
        actorLabel: actor.email,
        groupId: share.groupId,
        action: "share-link-revoked",
        targetType: share.targetType,
        targetId: share.targetId,
        details: { shareId: share.id },
      },
      transaction,
    );
  });
}

export type ResolvedLink = {
  shareId: string;
  groupId: string;
  groupName: string;
  targetType: LinkTargetType;
  targetId: string;
  expiresAt: Date | null;
};

/** The target of a link in force at `now`, or null when the token is unknown, revoked or expired. */
export async function resolveShareLink(token: string, now = new Date()): Promise<ResolvedLink | null> {
  if (typeof token !== "string" || !looksLikeLinkToken(token)) return null;
  const share = await Share.findOne({ where: { linkTokenHash: hashToken(token), granteeUserId: null } });
  if (!share || linkStateAt(share, now) !== "in force") return null;
  const group = await Group.findByPk(share.groupId, { attributes: ["name"] });
  return {
    shareId: share.id,
    groupId: share.groupId,
    groupName: group?.name ?? "",
    targetType: share.targetType,
    targetId: share.targetId,
    expiresAt: share.expiresAt,
  };
}

/**
 * A spectrum reachable through the link: it must belong to the shared project, or to the shared
 * series, or be the supernatant measured for a point of the shared series (part of that point's
 * measurement, as canReadSpectrum reads it for a collaborator).
 */
export async function spectrumThroughLink(link: ResolvedLink, spectrumId: string): Promise<Spectrum | null> {
  if (!isUuid(spectrumId)) return null;
  if (link.targetType === "project") return Spectrum.findOne({ where: { id: spectrumId, projectId: link.targetId } });
  const spectrum = await Spectrum.findByPk(spectrumId);
  if (!spectrum) return null;
  if (spectrum.seriesId === link.targetId) return spectrum;
  const pointId = spectrum.supernatantOfSpectrumId;
  return pointId && (await Spectrum.count({ where: { id: pointId, seriesId: link.targetId } })) === 1 ? spectrum : null;
}

// --- what the public page shows ---

export type LinkedSpectrum = { id: string; fileName: string; status: string; technique: string };
export type LinkedProject = {
  name: string;
  series: { id: string; name: string; kind: string; spectra: number }[];
  spectra: (LinkedSpectrum & { seriesName: string | null })[];
};

/** Series names and spectra (names and states only) of a shared project. */
export async function linkedProject(projectId: string): Promise<LinkedProject | null> {
  const project = await Project.findByPk(projectId, { attributes: ["name"] });
  if (!project) return null;
  const series = await selectRows<{ id: string; name: string; kind: string; spectra: string }>(
    `SELECT se.id, se.name, se.kind, (SELECT count(*) FROM spectra s WHERE s.series_id = se.id) AS spectra
     FROM series se WHERE se.project_id = :projectId ORDER BY se.name`,
    { projectId },
  );
  const spectra = await selectRows<{ id: string; file_name: string; status: string; technique: string; series_name: string | null }>(
    `SELECT s.id, s.file_name, s.status, s.technique, se.name AS series_name
     FROM spectra s LEFT JOIN series se ON se.id = s.series_id WHERE s.project_id = :projectId ORDER BY s.created_at LIMIT 2000`,
    { projectId },
  );
  return {
    name: project.name,
    series: series.map((s) => ({ id: s.id, name: s.name, kind: s.kind, spectra: Number(s.spectra) })),
    spectra: spectra.map((s) => ({ id: s.id, fileName: s.file_name, status: s.status, technique: s.technique, seriesName: s.series_name })),
  };
}

/** Safety cautions for the samples (and the materials recorded on spectra) under a shared target, one per hazard. */
export async function linkedHazards(type: LinkTargetType, id: string): Promise<{ flags: HazardFlag[]; photoluminescence: boolean }> {
  const column = type === "series" ? "series_id" : "project_id";
  const rows = await selectRows<{
    material: string | null;
    core_shell: string | null;
    ligand: string | null;
    solvent: string | null;
    technique: string;
  }>(
    `SELECT DISTINCT coalesce(sa.material, s.material) AS material, sa.core_shell, sa.ligand, coalesce(nullif(s.solvent, ''), sa.solvent) AS solvent, s.technique
     FROM spectra s LEFT JOIN samples sa ON sa.id = s.sample_id WHERE s.${column} = :id`,
    { id },
  );
  const flags = new Map<string, HazardFlag>();
  for (const r of rows) {
    for (const f of hazardsOf({
      material: r.material ?? "",
      coreShell: r.core_shell ?? "",
      ligand: r.ligand ?? "",
      solvent: r.solvent ?? "",
    }))
      if (!flags.has(f.code)) flags.set(f.code, f);
  }
  return { flags: [...flags.values()], photoluminescence: rows.some((r) => usesUvOrLaserLight(r.technique)) };
}

// --- the steward's list ---

export type ShareLinkRow = {
  id: string;
  prefix: string;
  targetType: LinkTargetType;
  targetLabel: string;
  createdAt: string;
  createdBy: string;
  expiresAt: string | null;
  revokedAt: string | null;
  state: LinkState;
};

/** Links of the groups the actor stewards, newest first. The prefix comes from the creation's audit event. */
export async function listShareLinks(actor: Actor, now = new Date()): Promise<ShareLinkRow[]> {
  const groups = stewardGroupIds(actor);
  if (!groups.length) return [];
  const rows = await Share.findAll({
    where: { groupId: { [Op.in]: groups }, linkTokenHash: { [Op.ne]: null } },
    order: [["createdAt", "DESC"]],
    limit: 300,
  });
  if (!rows.length) return [];
  const ids = rows.map((r) => r.id);
  const events = await selectRows<{ share_id: string; prefix: string | null; actor_label: string }>(
    `SELECT details->>'shareId' AS share_id, details->>'prefix' AS prefix, actor_label FROM audit_events
     WHERE action = 'share-link-created' AND details->>'shareId' IN (:ids)`,
    { ids },
  );
  const byShare = new Map(events.map((e) => [e.share_id, e]));
  const labels = new Map<string, string>();
  for (const r of rows) {
    const key = `${r.targetType}:${r.targetId}`;
    if (!labels.has(key)) labels.set(key, (await targetName(r.targetType, r.targetId)) || "(deleted)");
  }
  return rows.map((r) => ({
    id: r.id,
    prefix: byShare.get(r.id)?.prefix ?? "",
    targetType: r.targetType,
    targetLabel: labels.get(`${r.targetType}:${r.targetId}`) ?? "(deleted)",
    createdAt: r.createdAt.toISOString(),
    createdBy: byShare.get(r.id)?.actor_label ?? "",
    expiresAt: r.expiresAt?.toISOString() ?? null,
    revokedAt: r.revokedAt?.toISOString() ?? null,
    state: linkStateAt(r, now),
  }));
}
