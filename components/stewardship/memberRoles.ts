/** The roles a member can be given, in the order the pickers list them. */
export const MEMBER_ROLES = ["spectroscopist", "lead", "steward", "collaborator"] as const;

export type ShareTargetOption = { type: "project" | "series"; id: string; label: string };
