"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { protectedAction } from "@/lib/actions/protected";
import { deleteSavedSearch, saveSearch } from "@/lib/queries/savedSearches";
import { hasFilters, searchQueryString, spectrumSearchSchema } from "@/lib/search/spectrumSearchQuery";
import { refuse } from "@/lib/errors";

/** Saves the search shown on the spectra page under a name, for the Overview. */
export const saveSearchAction = protectedAction(
  z.object({
    name: z.string({ error: "name: required." }).trim().min(1, "name: give the search a name.").max(120, "name: at most 120 characters."),
    query: z.string().max(2000, "query: too long to save."),
  }),
  async (input, actor) => {
    const parsed = spectrumSearchSchema.safeParse(Object.fromEntries(new URLSearchParams(input.query)));
    if (!parsed.success) throw refuse(400, `The search is not valid: ${parsed.error.issues[0]?.message ?? "check the filters"}.`, "query");
    if (!hasFilters(parsed.data)) throw refuse(400, "Set at least one filter before saving a search.", "query");
    await saveSearch(actor, input.name, searchQueryString(parsed.data));
    revalidatePath("/");
    return { ok: true, message: `Saved “${input.name}”; it is listed on the Overview.` };
  },
);

export const deleteSavedSearchAction = protectedAction(z.object({ id: z.string().uuid("id: not a valid id.") }), async (input, actor) => {
  if (!(await deleteSavedSearch(actor, input.id))) throw refuse(400, "That saved search was not found.", "id");
  revalidatePath("/");
  return { ok: true, message: "Saved search removed." };
});
