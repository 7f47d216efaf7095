"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { protectedAction } from "@/lib/actions/protected";
import { canDeleteInGroup, groupOfSpectrum } from "@/lib/auth/access";
import { deleteSpectrum } from "@/lib/stewardship/deletion";
import { Spectrum, models } from "@/models";
import { refuse } from "@/lib/errors";

/**
 * Deletes one spectrum (its raw file, its row, its analyses) for a spectroscopist, group
 * lead or data steward of its group. A legal hold refuses it and says why; a spectrum
 * that others use as their reference is refused too. A tombstone and an audit event remain.
 */
export const deleteSpectrumAction = protectedAction(
  z.object({
    spectrumId: z.string({ error: "spectrumId: required." }).uuid("spectrumId: not a valid id."),
    confirm: z
      .string({ error: "confirm: type delete to confirm." })
      .trim()
      .toLowerCase()
      .pipe(z.literal("delete", { error: "confirm: type delete to confirm." })),
  }),
  async (input, actor) => {
    models();
    const spectrum = await Spectrum.findByPk(input.spectrumId);
    const groupId = spectrum ? await groupOfSpectrum(spectrum) : null;
    if (!spectrum || !groupId || !canDeleteInGroup(actor, groupId)) throw refuse(400, "Spectrum not found.", "spectrumId");
    await deleteSpectrum(spectrum.id, { cause: actor.memberships.some((m) => m.groupId === groupId && m.role === "steward") ? "steward" : "owner", actorId: actor.id, actorLabel: actor.email });
    revalidatePath("/spectra");
    redirect("/spectra?deleted=1");
  },
);
