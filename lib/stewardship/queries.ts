import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { managedMemberships, stewardGroupIds } from "@/lib/auth/access";
import { selectRows } from "@/lib/db";
import { listProjectChoices } from "@/lib/queries/projects";
import { Invitation, LegalHold, Membership, RetentionPolicy, Share, User } from "@/models";
import { describeProtection, planSweep } from "./planSweep";
import { loadSnapshot } from "./snapshot";
import { DAY_MS, type DataClass, type PolicyRule, type SweepPlan } from "./types";

// Reads behind the stewardship pages, reshaped into view rows. Every function is
// limited to the groups the actor stewards (or leads, for members).

export const DATA_CLASS_LABELS: Record<DataClass, string> = {
  raw: "Raw files",
  processed: "Processed data and analyses",
  drafts: "Drafts and failed uploads",
};

export type PolicyRow = {
  id: string;
  projectId: string;
  projectName: string;
  dataClass: DataClass;
  keepDays: number;
  onExpiry: "delete" | "flag";
  updatedAt: string;
};

export async function listPolicies(actor: Actor): Promise<PolicyRow[]> {
  const projects = await listProjectChoices(actor, "steward");
  if (!projects.length) return [];
  const byId = new Map(projects.map((p) => [p.id, p]));
  const rows = await RetentionPolicy.findAll({ where: { projectId: { [Op.in]: [...byId.keys()] } }, order: [["createdAt", "ASC"]] });
  return rows.map((r) => ({
    id: r.id,
    projectId: r.projectId,
    projectName: byId.get(r.projectId)?.name ?? "",
    dataClass: r.dataClass,
    keepDays: r.keepDays,
    onExpiry: r.onExpiry,
    updatedAt: r.updatedAt.toISOString(),
  }));
}

export type PreviewRow = { id: string; kind: string; label: string; createdAt: string; expiredAt: string; sizeBytes: number; why?: string };
export type PolicyPreview = { toDelete: PreviewRow[]; toFlag: PreviewRow[]; protectedItems: PreviewRow[]; bytes: number };

/** The dry run: what this policy, if saved now, would delete, flag and keep in its project. */
export async function previewPolicy(rule: Omit<PolicyRule, "id">, now = new Date()): Promise<PolicyPreview> {
  // a policy on raw files or drafts concerns spectra only: analyses need not be read
  const snapshot = await loadSnapshot([rule.projectId], { spectraOnly: rule.dataClass !== "processed" });
  const policies = [
    ...snapshot.policies.filter((p) => !(p.projectId === rule.projectId && p.dataClass === rule.dataClass)),
    { ...rule, id: "preview" },
  ];
  const plan: SweepPlan = planSweep(snapshot.items, policies, snapshot.holds, now);
  const mine = (a: { policy: PolicyRule }) => a.policy.id === "preview";
  const row = (a: SweepPlan["toDelete"][number], why?: string): PreviewRow => ({
    id: a.item.id,
    kind: a.item.kind,
    label: a.item.label,
    createdAt: a.item.createdAt.toISOString(),
    expiredAt: a.expiredAt.toISOString(),
    sizeBytes: a.item.sizeBytes,
    why,
  });
  const toDelete = plan.toDelete.filter(mine).map((a) => row(a));
  return {
    toDelete,
    toFlag: plan.toFlag.filter(mine).map((a) => row(a)),
    protectedItems: plan.protectedItems.filter(mine).map((a) => row(a, describeProtection(a.protection))),
    bytes: toDelete.reduce((s, r) => s + r.sizeBytes, 0),
  };
}

export type HoldRow = {
  id: string;
  targetType: string;
  targetId: string;
  targetLabel: string;
  reason: string;
  placedBy: string;
  placedAt: string;
  liftedAt: string | null;
  liftedBy: string | null;
};

async function userLabels(ids: (string | null)[]): Promise<Map<string, string>> {
  const list = [...new Set(ids.filter((x): x is string => !!x))];
  if (!list.length) return new Map();
  return new Map((await User.findAll({ where: { id: { [Op.in]: list } }, attributes: ["id", "email"] })).map((u) => [u.id, u.email]));
}

export async function targetLabels(pairs: { targetType: string; targetId: string }[]): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  const ids = (t: string) => [...new Set(pairs.filter((p) => p.targetType === t).map((p) => p.targetId))];
  const lookups: [string, string][] = [
    ["project", "projects"],
    ["series", "series"],
    ["sample", "samples"],
    ["spectrum", "spectra"],
  ];
  for (const [type, table] of lookups) {
    const list = ids(type);
    if (!list.length) continue;
    const col = table === "spectra" ? "file_name" : "name";
    const rows = await selectRows<{ id: string; label: string }>(`SELECT id, ${col} AS label FROM ${table} WHERE id IN (:list)`, { list });
    for (const r of rows) out.set(`${type}:${r.id}`, r.label);
  }
  return out;
}

export async function listHolds(actor: Actor): Promise<HoldRow[]> {
  const groups = stewardGroupIds(actor);
  if (!groups.length) return [];
  const rows = await LegalHold.findAll({ where: { groupId: { [Op.in]: groups } }, order: [["placedAt", "DESC"]], limit: 300 });
  const users = await userLabels(rows.flatMap((r) => [r.placedBy, r.liftedBy]));
  const labels = await targetLabels(rows);
  return rows.map((r) => ({
    id: r.id,
    targetType: r.targetType,
    targetId: r.targetId,
    targetLabel: labels.get(`${r.targetType}:${r.targetId}`) ?? "(deleted)",
    reason: r.reason,
    placedBy: users.get(r.placedBy ?? "") ?? "—",
    placedAt: r.placedAt.toISOString(),
    liftedAt: r.liftedAt?.toISOString() ?? null,
    liftedBy: r.liftedBy ? (users.get(r.liftedBy) ?? "—") : null,
  }));
}

export type HoldTargetOption = { type: "project" | "series" | "sample" | "spectrum"; id: string; label: string };

/** What a steward can put under hold, grouped by kind. */
export async function holdTargetOptions(actor: Actor): Promise<HoldTargetOption[]> {
  const groups = stewardGroupIds(actor);
  if (!groups.length) return [];
  const rows = await selectRows<{ type: HoldTargetOption["type"]; id: string; label: string }>(
    `SELECT 'project' AS type, p.id, p.name AS label FROM projects p WHERE p.group_id IN (:groups)
     UNION ALL SELECT 'series', s.id, p.name || ' / ' || s.name FROM series s JOIN projects p ON p.id = s.project_id WHERE p.group_id IN (:groups)
     UNION ALL SELECT 'sample', x.id, x.name FROM samples x WHERE x.group_id IN (:groups)
     UNION ALL SELECT 'spectrum', sp.id, p.name || ' / ' || sp.file_name FROM spectra sp JOIN projects p ON p.id = sp.project_id WHERE p.group_id IN (:groups)
     ORDER BY 1, 3 LIMIT 2000`,
    { groups },
  );
  return rows;
}

/** A stored item whose keep period ended under a "flag" rule, with what it belongs to and the rule that flagged it. */
export type CleanupItem = {
  id: string;
  targetType: string;
  label: string;
  projectName: string;
  dataClass: DataClass;
  flaggedAt: string;
  storedAt: string | null;
  spectrumId: string | null;
  sample: { id: string; name: string } | null;
  series: { id: string; name: string } | null;
  rule: { keepDays: number; dataClass: DataClass } | null;
};

export async function listCleanupDue(actor: Actor): Promise<CleanupItem[]> {
  const groups = stewardGroupIds(actor);
  if (!groups.length) return [];
  const rows = await selectRows<{
    id: string;
    target_type: string;
    label: string;
    project_name: string;
    data_class: DataClass;
    flagged_at: Date;
    stored_at: Date | null;
    spectrum_id: string | null;
    sample_id: string | null;
    sample_name: string | null;
    series_id: string | null;
    series_name: string | null;
    keep_days: number | null;
    policy_class: DataClass | null;
  }>(
    `SELECT f.id, f.target_type, f.label, p.name AS project_name, f.data_class, f.flagged_at, s.created_at AS stored_at,
            s.id AS spectrum_id, sa.id AS sample_id, sa.name AS sample_name, se.id AS series_id, se.name AS series_name,
            rp.keep_days, rp.data_class AS policy_class
     FROM retention_flags f
     JOIN projects p ON p.id = f.project_id
     LEFT JOIN retention_policies rp ON rp.id = f.policy_id
     LEFT JOIN analysis_runs ar ON f.target_type = 'analysis-run' AND ar.id = f.target_id
     LEFT JOIN spectra s ON s.id = CASE WHEN f.target_type = 'spectrum' THEN f.target_id ELSE ar.spectrum_id END
     LEFT JOIN samples sa ON sa.id = s.sample_id
     LEFT JOIN series se ON se.id = s.series_id
     WHERE f.group_id IN (:groups) AND f.decision IS NULL
     ORDER BY f.flagged_at ASC
     LIMIT 500`,
    { groups },
  );
  return rows.map((r) => ({
    id: r.id,
    targetType: r.target_type,
    label: r.label,
    projectName: r.project_name,
    dataClass: r.data_class,
    flaggedAt: new Date(r.flagged_at).toISOString(),
    storedAt: r.stored_at ? new Date(r.stored_at).toISOString() : null,
    spectrumId: r.spectrum_id,
    sample: r.sample_id ? { id: r.sample_id, name: r.sample_name ?? "" } : null,
    series: r.series_id ? { id: r.series_id, name: r.series_name ?? "" } : null,
    rule: r.keep_days !== null && r.policy_class ? { keepDays: r.keep_days, dataClass: r.policy_class } : null,
  }));
}

// --- members, invitations and shares ---

export type MemberRow = {
  id: string;
  userId: string;
  email: string;
  name: string;
  role: string;
  groupId: string;
  groupName: string;
  isSelf: boolean;
};
export type InvitationRow = {
  id: string;
  email: string;
  role: string;
  groupName: string;
  expiresAt: string;
  state: "open" | "accepted" | "expired" | "revoked";
  share: string | null;
};
export type ShareRow = {
  id: string;
  targetType: string;
  targetId: string;
  targetLabel: string;
  grantee: string;
  expiresAt: string | null;
  revokedAt: string | null;
  live: boolean;
  createdAt: string;
};

export async function listMembers(actor: Actor): Promise<MemberRow[]> {
  const groups = managedMemberships(actor);
  if (!groups.length) return [];
  const names = new Map(groups.map((g) => [g.groupId, g.groupName]));
  const rows = await Membership.findAll({
    where: { groupId: { [Op.in]: [...names.keys()] } },
    include: [User],
    order: [
      ["role", "ASC"],
      ["createdAt", "ASC"],
    ],
  });
  return rows.map((m) => {
    const u = (m as unknown as { User: User }).User;
    return {
      id: m.id,
      userId: m.userId,
      email: u.email,
      name: u.name,
      role: m.role,
      groupId: m.groupId,
      groupName: names.get(m.groupId) ?? "",
      isSelf: m.userId === actor.id,
    };
  });
}

export async function listInvitations(actor: Actor): Promise<InvitationRow[]> {
  const groups = managedMemberships(actor);
  if (!groups.length) return [];
  const names = new Map(groups.map((g) => [g.groupId, g.groupName]));
  const rows = await Invitation.findAll({ where: { groupId: { [Op.in]: [...names.keys()] } }, order: [["createdAt", "DESC"]], limit: 100 });
  const labels = await targetLabels(
    rows.filter((r) => r.shareTargetType).map((r) => ({ targetType: r.shareTargetType!, targetId: r.shareTargetId! })),
  );
  const now = Date.now();
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    role: r.role,
    groupName: names.get(r.groupId) ?? "",
    expiresAt: r.expiresAt.toISOString(),
    state: r.acceptedAt ? "accepted" : r.revokedAt ? "revoked" : r.expiresAt.getTime() <= now ? "expired" : "open",
    share: r.shareTargetType ? `${r.shareTargetType} ${labels.get(`${r.shareTargetType}:${r.shareTargetId}`) ?? ""}` : null,
  }));
}

export async function listShares(actor: Actor): Promise<ShareRow[]> {
  const groups = stewardGroupIds(actor);
  if (!groups.length) return [];
  const rows = await Share.findAll({
    where: { groupId: { [Op.in]: groups }, granteeUserId: { [Op.ne]: null } },
    order: [["createdAt", "DESC"]],
    limit: 300,
  });
  const users = await userLabels(rows.map((r) => r.granteeUserId));
  const labels = await targetLabels(rows);
  const now = Date.now();
  return rows.map((r) => ({
    id: r.id,
    targetType: r.targetType,
    targetId: r.targetId,
    targetLabel: labels.get(`${r.targetType}:${r.targetId}`) ?? "(deleted)",
    grantee: users.get(r.granteeUserId ?? "") ?? "—",
    expiresAt: r.expiresAt?.toISOString() ?? null,
    revokedAt: r.revokedAt?.toISOString() ?? null,
    live: !r.revokedAt && (!r.expiresAt || r.expiresAt.getTime() > now),
    createdAt: r.createdAt.toISOString(),
  }));
}

export async function shareTargetOptions(actor: Actor): Promise<{ type: "project" | "series"; id: string; label: string }[]> {
  const groups = managedMemberships(actor).map((g) => g.groupId);
  if (!groups.length) return [];
  return selectRows(
    `SELECT 'project' AS type, p.id, p.name AS label FROM projects p WHERE p.group_id IN (:groups)
     UNION ALL SELECT 'series', s.id, p.name || ' / ' || s.name FROM series s JOIN projects p ON p.id = s.project_id WHERE p.group_id IN (:groups)
     ORDER BY 1, 3`,
    { groups },
  );
}

// --- storage ---

export type StorageRow = {
  projectId: string;
  projectName: string;
  dataClass: DataClass;
  items: number;
  bytes: number;
  policy: string | null;
  freeNow: number;
  free30: number;
  free365: number;
  nextExpiry: string | null;
};

/** Use by project and data class, and what the current policies will free and when (holds and dependencies as of now). */
export async function storageOverview(actor: Actor, now = new Date()): Promise<StorageRow[]> {
  const projects = await listProjectChoices(actor, "steward");
  if (!projects.length) return [];
  const snapshot = await loadSnapshot(projects.map((p) => p.id));
  const at = (days: number) => planSweep(snapshot.items, snapshot.policies, snapshot.holds, new Date(now.getTime() + days * DAY_MS));
  const keyOf = (projectId: string, dataClass: DataClass) => `${projectId}:${dataClass}`;
  // one pass over the items and one over each plan, summed by project and class
  const byKey = new Map<string, { items: number; bytes: number; nextExpiry: number; freeNow: number; free30: number; free365: number }>();
  const entry = (key: string) => {
    let e = byKey.get(key);
    if (!e) byKey.set(key, (e = { items: 0, bytes: 0, nextExpiry: Infinity, freeNow: 0, free30: 0, free365: 0 }));
    return e;
  };
  const policies = new Map(snapshot.policies.map((x) => [keyOf(x.projectId, x.dataClass), x]));
  for (const item of snapshot.items) {
    const key = keyOf(item.projectId, item.dataClass);
    const e = entry(key);
    e.items += 1;
    e.bytes += item.sizeBytes;
    const policy = policies.get(key);
    if (policy) {
      const expiry = item.createdAt.getTime() + policy.keepDays * DAY_MS;
      if (expiry > now.getTime() && expiry < e.nextExpiry) e.nextExpiry = expiry;
    }
  }
  for (const [field, days] of [
    ["freeNow", 0],
    ["free30", 30],
    ["free365", 365],
  ] as const) {
    for (const a of at(days).toDelete) entry(keyOf(a.item.projectId, a.item.dataClass))[field] += a.item.sizeBytes;
  }
  const rows: StorageRow[] = [];
  for (const p of projects) {
    for (const dataClass of ["raw", "processed", "drafts"] as const) {
      const key = keyOf(p.id, dataClass);
      const e = entry(key);
      const policy = policies.get(key);
      rows.push({
        projectId: p.id,
        projectName: p.name,
        dataClass,
        items: e.items,
        bytes: e.bytes,
        policy: policy ? `${policy.onExpiry === "delete" ? "delete" : "flag"} after ${policy.keepDays} days` : null,
        freeNow: e.freeNow,
        free30: e.free30,
        free365: e.free365,
        nextExpiry: Number.isFinite(e.nextExpiry) ? new Date(e.nextExpiry).toISOString() : null,
      });
    }
  }
  return rows;
}
