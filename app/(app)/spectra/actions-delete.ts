"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { ActionRefused, protectedAction } from "@/lib/actions/protected";
import { canDeleteInGroup, groupOfSpectrum } from "@/lib/auth/access";
import { DeletionRefused, deleteSpectrum } from "@/lib/stewardship/deletion";
import { deleteSpectrumInput } from "@/lib/stewardship/deleteConfirm";
import { Spectrum, models } from "@/models";

/**
 * Deletes one spectrum (its raw file, its row, its analyses) for a spectroscopist, group
 * lead or data steward of its group. A legal hold refuses it and says why; a spectrum
 * that others use as their reference is refused too. A tombstone and an audit event remain.
 */
export const deleteSpectrumAction = protectedAction(
  deleteSpectrumInput,
  async (input, actor) => {
    models();
    const spectrum = await Spectrum.findByPk(input.spectrumId);
    const groupId = spectrum ? await groupOfSpectrum(spectrum) : null;
    if (!spectrum || !groupId || !canDeleteInGroup(actor, groupId)) throw new ActionRefused("Spectrum not found.", "spectrumId");
    let tombstoneId: string;
    try {
      ({ id: tombstoneId } = await deleteSpectrum(spectrum.id, { cause: actor.memberships.some((m) => m.groupId === groupId && m.role === "steward") ? "steward" : "owner", actorId: actor.id, actorLabel: actor.email }));
    } catch (error) {
      if (error instanceof DeletionRefused) throw new ActionRefused(error.message);
      throw error;
    }
    revalidatePath("/spectra");
    redirect(`/spectra?deleted=${tombstoneId}`);
  },
);
