import type { Technique } from "@/lib/engine";
import { headerSignature } from "./headerSignature";
import { profileByName, profileForSignature, projectHasProfiles } from "./importProfiles";
import { profileChoiceSchema, profileFields } from "./profileChoice";

export type AppliedProfile = {
  /** The fields to read the file with: what the person sent, with the profile's choices where they sent nothing. */
  fields: Record<string, unknown>;
  profile: { name: string; how: "named" | "matched" } | null;
  /** The file's header signature, when it was worked out (for saving a profile from a preview). */
  signature: string | null;
};

const blank = (v: unknown) => v === undefined || v === null || (typeof v === "string" && v.trim() === "");

/**
 * Applies a project's import profile to one file's fields. `profile` names one ("none": no
 * profile); left empty, the profile whose header signature equals the file's applies, if any.
 * Fields the person sent always win over the profile's.
 */
export async function applyProfile(
  projectId: string,
  fields: Record<string, unknown>,
  file: { fileName: string; bytes: Uint8Array },
  maxBytes: number,
  options: { wantSignature?: boolean } = {},
): Promise<AppliedProfile> {
  const requested = typeof fields.profile === "string" ? fields.profile.trim() : "";
  const technique = (blank(fields.technique) ? "absorption" : String(fields.technique)) as Technique;
  const needSignature = options.wantSignature || (requested === "" && (await projectHasProfiles(projectId)));
  const signature = needSignature ? await headerSignature(file.fileName, file.bytes, technique, maxBytes) : null;
  if (requested.toLowerCase() === "none") return { fields, profile: null, signature };
  const profile =
    requested !== "" ? await profileByName(projectId, requested) : signature ? await profileForSignature(projectId, signature) : null;
  if (!profile) return { fields, profile: null, signature };
  const merged: Record<string, unknown> = { ...fields };
  for (const [k, v] of Object.entries(profileFields(profileChoiceSchema.parse(profile.choice)))) if (blank(merged[k])) merged[k] = v;
  return { fields: merged, profile: { name: profile.name, how: requested !== "" ? "named" : "matched" }, signature };
}
