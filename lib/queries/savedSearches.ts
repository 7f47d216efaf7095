import { QueryTypes } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { selectRows, sequelize } from "@/lib/db";
import { listSpectra } from "@/lib/queries/spectra";
import type { FastCount } from "@/lib/search/fastCount";
import { spectrumSearchSchema } from "@/lib/search/spectrumSearchQuery";

export type SavedSearch = { id: string; name: string; query: string; count: FastCount | null };

/**
 * Saves (or renames onto) a person's search under a name. The query is stored as the page's
 * canonical query string; saving the same name again replaces its query.
 */
export async function saveSearch(actor: Actor, name: string, query: string): Promise<string> {
  const rows = await sequelize().query<{ id: string }>(
    `INSERT INTO saved_searches (user_id, name, query) VALUES (:userId, :name, :query)
     ON CONFLICT (user_id, name) DO UPDATE SET query = EXCLUDED.query RETURNING id`,
    { replacements: { userId: actor.id, name, query }, type: QueryTypes.SELECT },
  );
  return rows[0]!.id;
}

export async function deleteSavedSearch(actor: Actor, id: string): Promise<boolean> {
  const rows = await sequelize().query<{ id: string }>("DELETE FROM saved_searches WHERE id = :id AND user_id = :userId RETURNING id", {
    replacements: { id, userId: actor.id },
    type: QueryTypes.SELECT,
  });
  return rows.length > 0;
}

/**
 * A person's saved searches with the number of spectra each finds now (a stored query that no
 * longer parses, say after a filter was renamed, is listed with no count rather than hidden).
 */
export async function listSavedSearches(actor: Actor): Promise<SavedSearch[]> {
  const saved = await selectRows<{ id: string; name: string; query: string }>(
    "SELECT id, name, query FROM saved_searches WHERE user_id = :userId ORDER BY name LIMIT 50",
    { userId: actor.id },
  );
  return Promise.all(
    saved.map(async (s) => {
      const parsed = spectrumSearchSchema.safeParse(Object.fromEntries(new URLSearchParams(s.query)));
      if (!parsed.success) return { ...s, count: null };
      const page = await listSpectra(actor, { ...parsed.data, after: undefined, limit: 1 });
      return { ...s, count: page?.count ?? { value: 0, exact: true } };
    }),
  );
}
