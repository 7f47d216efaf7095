import { describe, expect, it } from "vitest";
import { orderParentChoices, parentVerdict, type ParentCandidate, type ParentTarget } from "@/lib/parents/orderParentChoices";

// Sources: hc = 1239.841984 eV·nm (CODATA 2018) for the first-exciton energies of CdSe dots with
// first excitons at 550 and 600 nm (3.0 and 4.6 nm by Yu et al., Chem. Mater. 2003, 15, 2854;
// docs DOMAIN.md check values); the 40 meV floor and wider-FWHM rule are the engine's
// (lib/engine/compare/checkReferenceMatch.ts, common practice); the ordering is this feature's rule.

const HC = 1239.841984;
const e550 = HC / 550; // 2.2543 eV
const e600 = HC / 600; // 2.0664 eV

const candidate = (over: Partial<ParentCandidate>): ParentCandidate => ({
  id: over.id ?? "c",
  fileName: `${over.id ?? "c"}.csv`,
  technique: "absorption",
  sampleId: null,
  sampleName: null,
  material: "CdSe",
  createdAt: "2026-11-01T00:00:00.000Z",
  firstExcitonEv: e550,
  fwhmMeV: 90,
  rangeEv: [1.65, 3.1],
  ...over,
});
const target = (over: Partial<ParentTarget> = {}): ParentTarget => ({
  technique: "absorption",
  sample: { id: "s", name: "Batch 7 reduced", material: "CdSe", parentIds: ["p"] },
  side: null,
  spectrumId: "self",
  ...over,
});

describe("parent picker order", () => {
  const list = [
    candidate({ id: "other-old", createdAt: "2026-10-01T00:00:00.000Z" }),
    candidate({ id: "parent-a", sampleId: "p", createdAt: "2026-10-02T00:00:00.000Z" }),
    candidate({ id: "pl-of-parent", sampleId: "p", technique: "pl" }),
    candidate({ id: "other-new", createdAt: "2026-11-05T00:00:00.000Z" }),
    candidate({ id: "pbs", material: "PbS" }),
    candidate({ id: "self", sampleId: "s" }),
  ];

  it("offers the registered parents' spectra of the same technique first, then the same material, newest first", () => {
    const { registered, related } = orderParentChoices(list, target());
    expect(registered.map((c) => c.id)).toEqual(["parent-a"]);
    expect(related.map((c) => c.id)).toEqual(["other-new", "other-old"]);
  });

  it("never offers another technique, another material or the spectrum itself", () => {
    const ids = Object.values(orderParentChoices(list, target()))
      .flat()
      .map((c) => c.id);
    for (const id of ["pl-of-parent", "pbs", "self"]) expect(ids).not.toContain(id);
  });

  it("without a sample, offers the project's spectra of the technique", () => {
    const { registered, related } = orderParentChoices(list, target({ sample: null }));
    expect(registered).toEqual([]);
    expect(related.map((c) => c.id)).toEqual(["other-new", "pbs", "parent-a", "other-old"]);
  });
});

describe("the engine's validity rule beside the field", () => {
  it("before upload: names a technique mismatch", () => {
    const verdict = parentVerdict(target({ technique: "pl" }), candidate({}));
    expect(verdict).toEqual({ ok: false, reason: "the reference does not match this sample: the sample is pl, the reference absorption" });
  });

  it("re-run: first excitons 188 meV apart (550 vs 600 nm dots) are refused, 20 meV apart are not", () => {
    const side = { technique: "absorption" as const, rangeEv: [1.65, 3.1] as [number, number], bandEv: e600, fwhmMeV: 100 };
    const far = parentVerdict(target({ side }), candidate({}));
    expect(far.ok).toBe(false);
    if (!far.ok) expect(far.reason).toContain(`${e600.toFixed(3)} eV vs ${e550.toFixed(3)} eV (188 meV apart, more than 100 meV)`);
    expect(parentVerdict(target({ side }), candidate({ firstExcitonEv: e600 + 0.02 })).ok).toBe(true);
  });
});
