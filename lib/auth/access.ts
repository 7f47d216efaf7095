import { Op } from "sequelize";
import { Project, Sample, Series, Share, Spectrum } from "@/models";
import type { Role } from "@/models/Membership";
import type { Actor } from "./actor";

// Every permission question the app asks, answered on the server from the actor's
// memberships and shares. Pages, route handlers and server actions all come here.

export const WRITER_ROLES: readonly Role[] = ["spectroscopist", "lead"];
export const MEMBER_ROLES: readonly Role[] = ["spectroscopist", "lead", "steward"];

export function roleIn(actor: Actor, groupId: string): Role | null {
  return actor.memberships.find((m) => m.groupId === groupId)?.role ?? null;
}

export function hasRole(actor: Actor, groupId: string, roles: readonly Role[]): boolean {
  const role = roleIn(actor, groupId);
  return role !== null && roles.includes(role);
}

/** Groups whose data the actor reads as a member (collaborators read only shares). */
export function memberGroupIds(actor: Actor): string[] {
  return actor.memberships.filter((m) => MEMBER_ROLES.includes(m.role)).map((m) => m.groupId);
}

/** Groups in which the actor may add data. */
export function writerGroupIds(actor: Actor): string[] {
  return actor.memberships.filter((m) => WRITER_ROLES.includes(m.role)).map((m) => m.groupId);
}

/** The actor's memberships in groups where they may add data (for group pickers). */
export function writerMemberships(actor: Actor): Actor["memberships"] {
  return actor.memberships.filter((m) => WRITER_ROLES.includes(m.role));
}

/** Whether the actor may add data in at least one group. */
export function writesSomewhere(actor: Actor): boolean {
  return writerGroupIds(actor).length > 0;
}

/** Every role the actor holds in some group (what the navigation rail offers follows it). */
export function rolesHeld(actor: Actor): ReadonlySet<Role> {
  return new Set(actor.memberships.map((m) => m.role));
}

/** Groups in which the actor is the group lead (and so reviews signatures). */
export function leadGroupIds(actor: Actor): string[] {
  return actor.memberships.filter((m) => m.role === "lead").map((m) => m.groupId);
}

export function canWrite(actor: Actor, groupId: string): boolean {
  return hasRole(actor, groupId, WRITER_ROLES);
}
export function canReview(actor: Actor, groupId: string): boolean {
  return hasRole(actor, groupId, ["lead"]);
}
export function canSteward(actor: Actor, groupId: string): boolean {
  return hasRole(actor, groupId, ["steward"]);
}

export type SharedTargets = { projectIds: string[]; seriesIds: string[] };

/** Projects and series shared with this person directly and still in force. */
export async function sharedTargets(actor: Actor): Promise<SharedTargets> {
  const rows = await Share.findAll({
    where: {
      granteeUserId: actor.id,
      revokedAt: null,
      [Op.or]: [{ expiresAt: null }, { expiresAt: { [Op.gt]: new Date() } }],
    },
    attributes: ["targetType", "targetId"],
  });
  return {
    projectIds: rows.filter((r) => r.targetType === "project").map((r) => r.targetId),
    seriesIds: rows.filter((r) => r.targetType === "series").map((r) => r.targetId),
  };
}

export type ReadableScope = { memberProjectIds: string[]; sharedProjectIds: string[]; sharedSeriesIds: string[] };

/**
 * What the actor reads, as ids, for list queries: the projects of its groups, the projects
 * shared with it, and the series shared with it one by one.
 */
export async function readableScope(actor: Actor): Promise<ReadableScope> {
  const groupIds = memberGroupIds(actor);
  const [members, shared] = await Promise.all([
    groupIds.length ? Project.findAll({ where: { groupId: { [Op.in]: groupIds } }, attributes: ["id"] }) : Promise.resolve([]),
    sharedTargets(actor),
  ]);
  return { memberProjectIds: members.map((p) => p.id), sharedProjectIds: shared.projectIds, sharedSeriesIds: shared.seriesIds };
}

export async function canReadProject(actor: Actor, project: Project): Promise<boolean> {
  if (memberGroupIds(actor).includes(project.groupId)) return true;
  return (await sharedTargets(actor)).projectIds.includes(project.id);
}

export async function canReadSeries(actor: Actor, series: Series): Promise<boolean> {
  const project = await Project.findByPk(series.projectId);
  if (project && (await canReadProject(actor, project))) return true;
  return (await sharedTargets(actor)).seriesIds.includes(series.id);
}

/**
 * Members read their groups' spectra; collaborators read the spectra of a shared project or
 * series, and the supernatant spectrum of a shared series' point (it is part of that point's
 * measurement, though not itself a point of the series).
 */
export async function canReadSpectrum(actor: Actor, spectrum: Spectrum): Promise<boolean> {
  const project = await Project.findByPk(spectrum.projectId);
  if (!project) return false;
  if (memberGroupIds(actor).includes(project.groupId)) return true;
  const shared = await sharedTargets(actor);
  if (shared.projectIds.includes(project.id) || (spectrum.seriesId !== null && shared.seriesIds.includes(spectrum.seriesId))) return true;
  if (!spectrum.supernatantOfSpectrumId || shared.seriesIds.length === 0) return false;
  const point = await Spectrum.findByPk(spectrum.supernatantOfSpectrumId, { attributes: ["id", "seriesId"] });
  return point?.seriesId != null && shared.seriesIds.includes(point.seriesId);
}

/** The group a spectrum belongs to, for write and review checks. */
export async function groupOfSpectrum(spectrum: Spectrum): Promise<string | null> {
  const project = await Project.findByPk(spectrum.projectId, { attributes: ["groupId"] });
  return project?.groupId ?? null;
}

// --- Stewardship (retention, holds, sharing, members, audit) ---

/** Groups in which the actor is the data steward. */
export function stewardGroupIds(actor: Actor): string[] {
  return actor.memberships.filter((m) => m.role === "steward").map((m) => m.groupId);
}

/** Group leads and data stewards add, remove and re-role members of their group. */
export function canManageMembers(actor: Actor, groupId: string): boolean {
  return hasRole(actor, groupId, ["lead", "steward"]);
}

/** The actor's memberships in groups whose members they manage (for the people page). */
export function managedMemberships(actor: Actor): Actor["memberships"] {
  return actor.memberships.filter((m) => canManageMembers(actor, m.groupId));
}

/** Who may delete a spectrum of a group (legal holds still refuse it). */
export function canDeleteInGroup(actor: Actor, groupId: string): boolean {
  return hasRole(actor, groupId, ["spectroscopist", "lead", "steward"]);
}

/** The group owning a project, series, sample or spectrum, or null when there is none. */
export async function groupOfTarget(targetType: "project" | "series" | "sample" | "spectrum", targetId: string): Promise<string | null> {
  if (targetType === "project") return (await Project.findByPk(targetId, { attributes: ["groupId"] }))?.groupId ?? null;
  if (targetType === "series") {
    const series = await Series.findByPk(targetId, { attributes: ["projectId"] });
    return series ? ((await Project.findByPk(series.projectId, { attributes: ["groupId"] }))?.groupId ?? null) : null;
  }
  if (targetType === "sample") return (await Sample.findByPk(targetId, { attributes: ["groupId"] }))?.groupId ?? null;
  const spectrum = await Spectrum.findByPk(targetId, { attributes: ["projectId"] });
  return spectrum ? groupOfSpectrum(spectrum) : null;
}
