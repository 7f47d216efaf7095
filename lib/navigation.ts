import type { Role } from "@/models/Membership";
import type { Actor } from "@/lib/auth/actor";
import { rolesHeld } from "@/lib/auth/access";

export type NavItem = { href: string; label: string; hint: string; roles: readonly Role[] };

const ALL: readonly Role[] = ["spectroscopist", "lead", "steward", "collaborator"];
const MEMBERS: readonly Role[] = ["spectroscopist", "lead", "steward"];

/** The navigation rail; each entry is shown to people holding one of its roles in some group. */
export const NAV_ITEMS: readonly NavItem[] = [
  { href: "/", label: "Overview", hint: "What changed lately", roles: ALL },
  { href: "/upload", label: "Upload", hint: "Drop instrument exports", roles: ["spectroscopist", "lead"] },
  { href: "/samples", label: "Samples", hint: "Batches, materials, parents", roles: MEMBERS },
  { href: "/spectra", label: "Spectra", hint: "Every stored spectrum", roles: MEMBERS },
  { href: "/series", label: "Series", hint: "Titrations and other series", roles: ALL },
  { href: "/review", label: "Review", hint: "Flagged signatures to decide", roles: ["lead"] },
  { href: "/stewardship", label: "Data care", hint: "Clean-up, keep rules, holds, sharing", roles: ["steward"] },
  { href: "/settings", label: "Settings", hint: "Tokens, notifications, outbox", roles: ALL },
];

export function navFor(actor: Actor): NavItem[] {
  const roles = rolesHeld(actor);
  return NAV_ITEMS.filter((item) => item.roles.some((r) => roles.has(r)));
}

export const ROLE_LABELS: Record<Role, string> = {
  spectroscopist: "Spectroscopist",
  lead: "Group lead",
  steward: "Data steward",
  collaborator: "Collaborator (read-only)",
};
