import { describe, expect, it } from "vitest";
import { deleteSpectrumInput } from "@/lib/stewardship/deleteConfirm";

// The delete-a-spectrum form's confirmation word: what people type, with a capital or in capitals
// (a phone capitalises the first letter by itself), confirms; anything else is refused naming the field.
const id = "00000000-0000-4000-8000-000000000001";

describe("delete confirmation", () => {
  for (const typed of ["delete", "Delete", "DELETE", "  delete ", "DeLeTe"]) {
    it(`accepts "${typed}"`, () => {
      expect(deleteSpectrumInput.safeParse({ spectrumId: id, confirm: typed }).success).toBe(true);
    });
  }
  for (const typed of ["", "deleted", "remove", "del ete", "yes"]) {
    it(`refuses "${typed}" and names the field`, () => {
      const r = deleteSpectrumInput.safeParse({ spectrumId: id, confirm: typed });
      expect(r.success).toBe(false);
      expect(r.error!.issues[0]!.path).toEqual(["confirm"]);
      expect(r.error!.issues[0]!.message).toBe("confirm: type delete to confirm.");
    });
  }
});
