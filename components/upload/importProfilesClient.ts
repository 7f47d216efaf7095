// Reads, saves and deletes a project's import profiles through /api/v1/projects/{id}/import-profiles.
import type { ImportProfileView } from "@/lib/ingest/profiles/importProfiles";
import type { ProfileChoice } from "@/lib/ingest/profiles/profileChoice";

export type ProfileResult = { ok: true } | { ok: false; message: string };

async function errorOf(response: Response): Promise<string> {
  const body = (await response.json().catch(() => null)) as { error?: { message?: string } } | null;
  return body?.error?.message ?? `the server answered ${response.status}`;
}

export async function fetchProfiles(projectId: string): Promise<ImportProfileView[]> {
  const response = await fetch(`/api/v1/projects/${projectId}/import-profiles`);
  if (!response.ok) return [];
  return ((await response.json()) as { profiles: ImportProfileView[] }).profiles;
}

export async function saveProfile(projectId: string, name: string, choice: ProfileChoice, signature: string): Promise<ProfileResult> {
  const response = await fetch(`/api/v1/projects/${projectId}/import-profiles`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ name, choice, signature }),
  });
  return response.ok ? { ok: true } : { ok: false, message: await errorOf(response) };
}

export async function deleteProfile(projectId: string, profileId: string): Promise<ProfileResult> {
  const response = await fetch(`/api/v1/projects/${projectId}/import-profiles/${profileId}`, { method: "DELETE" });
  return response.ok ? { ok: true } : { ok: false, message: await errorOf(response) };
}
