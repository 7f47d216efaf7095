import type { Actor } from "@/lib/auth/actor";
import { memberGroupIds, readableScope } from "@/lib/auth/access";
import { selectRows } from "@/lib/db";

export type SearchChoices = {
  projects: { id: string; name: string }[];
  uploaders: { id: string; name: string }[];
  /** The sample named in the search, to show its name beside the filter. */
  sampleName: string | null;
};

/** Choices for the spectra search form: readable projects, the people of the actor's groups. */
export async function searchChoices(actor: Actor, sampleId: string | undefined): Promise<SearchChoices> {
  const scope = await readableScope(actor);
  const projectIds = [...new Set([...scope.memberProjectIds, ...scope.sharedProjectIds])];
  const groupIds = memberGroupIds(actor);
  const [projects, uploaders, sample] = await Promise.all([
    projectIds.length
      ? selectRows<{ id: string; name: string }>("SELECT id, name FROM projects WHERE id IN (:projectIds) ORDER BY name", { projectIds })
      : [],
    groupIds.length
      ? selectRows<{ id: string; name: string }>(
          "SELECT DISTINCT u.id, u.name FROM users u JOIN memberships m ON m.user_id = u.id WHERE m.group_id IN (:groupIds) AND m.role <> 'collaborator' ORDER BY u.name",
          { groupIds },
        )
      : [],
    sampleId ? selectRows<{ name: string }>("SELECT name FROM samples WHERE id = :sampleId", { sampleId }) : [],
  ]);
  return { projects, uploaders, sampleName: sample[0]?.name ?? null };
}
