"use server";

import { revalidatePath } from "next/cache";
import { protectedAction } from "@/lib/actions/protected";
import { requestReanalysis } from "@/lib/ingest";
import { formFieldOf, rerunFormSchema, toReanalysisChanges } from "@/lib/spectrum-view/rerunSchema";
import { Refusal, refuse } from "@/lib/errors";

/** Re-runs the analysis of one spectrum with changed parameters; earlier runs are kept for provenance. */
export const rerunAnalysis = protectedAction(rerunFormSchema, async (input, actor) => {
  const changes = toReanalysisChanges(input);
  if (Object.keys(changes).length === 0)
    throw refuse(400, "Change at least one parameter; an unchanged run would repeat the last one.", "form");
  try {
    const result = await requestReanalysis(input.spectrumId, changes, actor);
    revalidatePath(`/spectra/${input.spectrumId}`);
    const message = result.created
      ? "A new analysis run was queued; the earlier runs are kept."
      : result.status === "done"
        ? "These parameters were already analysed: that run is shown."
        : "A run with these parameters is already on its way.";
    return { ok: true, message, values: { runId: result.runId, status: result.status } };
  } catch (error) {
    if (error instanceof Refusal) {
      const { field, message } = formFieldOf(error.field, error.message);
      throw refuse(400, error.status === 404 ? "This spectrum was not found." : message, field);
    }
    throw error;
  }
});
