import type { ShareTargetOption } from "./memberRoles";

/**
 * The options of a share-target picker: a first, empty choice (`none`: selectable, for "nothing
 * shared"; else a disabled prompt), then each project or series as "Project: name", valued
 * "type:id" as the actions read it.
 */
export function ShareTargetOptions({ targets, none }: { targets: readonly ShareTargetOption[]; none?: string }) {
  return (
    <>
      {none ? (
        <option value="">{none}</option>
      ) : (
        <option value="" disabled>
          Choose a project or series…
        </option>
      )}
      {targets.map((t) => (
        <option key={t.id} value={`${t.type}:${t.id}`}>
          {t.type === "series" ? "Series" : "Project"}: {t.label}
        </option>
      ))}
    </>
  );
}
