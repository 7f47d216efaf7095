import type { ShareTargetOption } from "./memberRoles";

/** The options of a share-target picker: each project or series as "Project: name", valued "type:id" as the actions read it. */
export function ShareTargetOptions({ targets }: { targets: readonly ShareTargetOption[] }) {
  return targets.map((t) => (
    <option key={t.id} value={`${t.type}:${t.id}`}>
      {t.type === "series" ? "Series" : "Project"}: {t.label}
    </option>
  ));
}
