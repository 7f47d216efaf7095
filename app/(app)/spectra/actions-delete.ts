"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { protectedAction } from "@/lib/actions/protected";
import { canDeleteInGroup, canSteward, groupOfSpectrum } from "@/lib/auth/access";
import { deleteSpectrum } from "@/lib/stewardship/deletion";
import { deleteSpectrumInput } from "@/lib/stewardship/deleteConfirm";
import { Spectrum } from "@/models";
import { refuse } from "@/lib/errors";

/**
 * Deletes one spectrum (its raw file, its row, its analyses) for a spectroscopist, group
 * lead or data steward of its group. A legal hold refuses it and says why; a spectrum
 * that others use as their reference is refused too. A tombstone and an audit event remain;
 * the spectra list then shows what was deleted, read from the tombstone.
 */
export const deleteSpectrumAction = protectedAction(deleteSpectrumInput, async (input, actor) => {
  const spectrum = await Spectrum.findByPk(input.spectrumId);
  const groupId = spectrum ? await groupOfSpectrum(spectrum) : null;
  if (!spectrum || !groupId || !canDeleteInGroup(actor, groupId)) throw refuse(400, "Spectrum not found.", "spectrumId");
  const tombstone = await deleteSpectrum(spectrum.id, {
    cause: canSteward(actor, groupId) ? "steward" : "owner",
    actorId: actor.id,
    actorLabel: actor.email,
  });
  revalidatePath("/spectra");
  redirect(`/spectra?deleted=${tombstone.id}`);
});
