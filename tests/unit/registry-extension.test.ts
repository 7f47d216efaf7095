import { describe, expect, expectTypeOf, it, vi } from "vitest";
import type { KeyOf, ThresholdNameOf } from "@/lib/registry/derive";
import type { KindSpec } from "@/lib/registry/flagKinds";
import type { TechniqueSpec } from "@/lib/registry/techniques";

// A test build of Bandkeep whose registries hold one more flag kind and one more technique than
// the real ones. Every module below is the app's own, loaded against the extended registries:
// if any of them kept its own list, the fake entry would be missing from it and this test fails.
// (The database half of the check is tests/integration/registry-database.test.ts.)

const FAKE_KIND = {
  label: "Fake growth",
  colour: "#123456",
  unit: "meV",
  signed: true,
  threshold: { name: "minFakeGrowthMeV", label: "Least fake growth (meV)", default: 7, min: 0, max: 50, unit: "meV" },
  seriesPlot: false,
  description: "a kind that exists only in this test",
} as const satisfies KindSpec;

const FAKE_TECHNIQUE = {
  label: "Fake scattering",
  shortLabel: "Fake",
  defaultAxis: "cm-1",
  defaultDirection: "ascending",
  jacobian: false,
  defaultYUnit: "counts",
  valueWord: "counts",
  bandRole: "vibrational-band",
  firstExciton: "none",
  firstBandWord: "main band",
  firstBandsWord: "main bands",
  firstBandLabel: "main band",
  seriesPlot: ["new-band"],
  smoothingSpanMeV: 2,
  derivativeSpanMeV: 6,
  baseline: "none",
  jcampDataType: "FAKE SPECTRUM",
  minRelativePeakAmplitude: 0,
  cautions: ["uv-laser-light"],
} as const satisfies TechniqueSpec;

vi.mock("@/lib/registry/flagKinds", async (importOriginal) => {
  const real = await importOriginal<typeof import("@/lib/registry/flagKinds")>();
  const specs = { ...real.FLAG_KIND_SPECS, "fake-kind": FAKE_KIND };
  return { ...real, FLAG_KIND_SPECS: specs, ...real.flagKindRegistry(real.GENERAL_THRESHOLDS, specs) };
});
vi.mock("@/lib/registry/techniques", async (importOriginal) => {
  const real = await importOriginal<typeof import("@/lib/registry/techniques")>();
  const specs = { ...real.TECHNIQUE_SPECS, fake: FAKE_TECHNIQUE };
  return { ...real, TECHNIQUE_SPECS: specs, ...real.techniqueRegistry(specs) };
});

describe("a fake flag kind and a fake technique added to the registries", () => {
  it("reach the TypeScript unions derived from a registry", async () => {
    const real = await vi.importActual<typeof import("@/lib/registry/flagKinds")>("@/lib/registry/flagKinds");
    type Specs = typeof real.FLAG_KIND_SPECS & { "fake-kind": typeof FAKE_KIND };
    expectTypeOf<KeyOf<Specs>>().toEqualTypeOf<import("@/lib/registry/flagKinds").FlagKind | "fake-kind">();
    expectTypeOf<"minFakeGrowthMeV">().toExtend<ThresholdNameOf<typeof real.GENERAL_THRESHOLDS, Specs>>();
    // A map keyed by the union must name the new kind: leaving it out does not compile.
    // @ts-expect-error "fake-kind" is missing
    const labels: Record<KeyOf<Specs>, string> = { ...real.KIND_LABELS };
    expect(Object.keys(labels)).not.toContain("fake-kind");
  });

  it("reach the zod enums of the review queue, the upload metadata and the API thresholds", async () => {
    const { queueQuerySchema } = await import("@/lib/review/schemas");
    expect(queueQuerySchema.parse({ kind: "fake-kind" }).kind).toBe("fake-kind");
    const refused = queueQuerySchema.safeParse({ kind: "not-a-kind" });
    expect(refused.success).toBe(false);
    expect(refused.error?.issues[0]?.message).toContain("fake-kind");

    const { ingestMetadataSchema } = await import("@/lib/ingest/metadata");
    const upload = ingestMetadataSchema.safeParse({ projectId: "6c1f3a4e-9a59-4a8e-8a3c-0d3c4a1b2c3d", technique: "fake" });
    expect(upload.error?.issues.filter((i) => i.path[0] === "technique") ?? []).toEqual([]);
    expect(
      ingestMetadataSchema.safeParse({ projectId: "6c1f3a4e-9a59-4a8e-8a3c-0d3c4a1b2c3d", technique: "raman" }).error?.issues[0]?.message,
    ).toBe("technique must be one of absorption, pl, ir, fake");

    const { reanalysisSchema, THRESHOLD_NAMES } = await import("@/lib/ingest/parameters");
    expect(THRESHOLD_NAMES).toContain("minFakeGrowthMeV");
    expect(reanalysisSchema.parse({ thresholds: { minFakeGrowthMeV: 12 } }).thresholds).toEqual({ minFakeGrowthMeV: 12 });
    expect(reanalysisSchema.safeParse({ thresholds: { minFakeGrowthMeV: 51 } }).success).toBe(false); // above the spec's max
  });

  it("reach the OpenAPI enums and the thresholds object", async () => {
    const { openApiDocument } = await import("@/lib/http/openapi");
    const text = JSON.stringify(openApiDocument());
    const kindEnums = [...text.matchAll(/"enum":\[("bleach"[^\]]*)\]/g)].map((m) => m[1]!);
    expect(kindEnums.length).toBeGreaterThanOrEqual(2);
    for (const e of kindEnums) expect(e).toContain('"fake-kind"');
    const techniqueEnums = [...text.matchAll(/"enum":\[("absorption"[^\]]*)\]/g)].map((m) => m[1]!);
    expect(techniqueEnums.length).toBeGreaterThanOrEqual(2);
    for (const e of techniqueEnums) expect(e).toContain('"fake"');
    expect(text).toContain('"minFakeGrowthMeV":{"type":"number","exclusiveMinimum":0,"maximum":50,"default":7');
  });

  it("reach the labels, colours, form fields, defaults and the engine's thresholds", async () => {
    const { KIND_LABELS } = await import("@/lib/registry/flagKinds");
    expect(KIND_LABELS["fake-kind" as keyof typeof KIND_LABELS]).toBe("Fake growth");
    const { FLAG_COLOURS } = await import("@/components/spectrum/markerStyle");
    expect(FLAG_COLOURS["fake-kind" as keyof typeof FLAG_COLOURS]).toBe("#123456");

    const { THRESHOLD_FIELDS, rerunFormSchema } = await import("@/lib/spectrum-view/rerunSchema");
    expect(THRESHOLD_FIELDS.find((f) => (f.name as string) === "minFakeGrowthMeV")).toEqual({
      name: "minFakeGrowthMeV",
      label: "Least fake growth (meV)",
      hint: "default 7",
      min: 0,
      max: 50,
    });
    const form = rerunFormSchema.safeParse({ spectrumId: "6c1f3a4e-9a59-4a8e-8a3c-0d3c4a1b2c3d", minFakeGrowthMeV: "60" });
    expect(form.success).toBe(false);
    expect(form.error?.issues.map((i) => i.message)).toContain("Least fake growth (meV) must be at most 50");

    const { DEFAULT_THRESHOLDS } = await import("@/lib/engine/analyzeSpectrum");
    expect((DEFAULT_THRESHOLDS as Record<string, number>).minFakeGrowthMeV).toBe(7);

    const { TECHNIQUE_LABELS } = await import("@/lib/registry/techniques");
    expect(TECHNIQUE_LABELS["fake" as keyof typeof TECHNIQUE_LABELS]).toBe("Fake scattering");
    const { usesUvOrLaserLight } = await import("@/lib/hazards");
    expect(usesUvOrLaserLight("fake")).toBe(true);
    expect(usesUvOrLaserLight("absorption")).toBe(false); // the case that must not warn
  });

  it("reach the database check the migrations build", async () => {
    const { REGISTRY_COLUMNS, inCheck } = await import("@/lib/registry/sqlChecks");
    expect(REGISTRY_COLUMNS.signatureKind.values).toContain("fake-kind");
    expect(REGISTRY_COLUMNS.spectrumTechnique.values).toContain("fake");
    expect(inCheck(REGISTRY_COLUMNS.signatureKind, REGISTRY_COLUMNS.signatureKind.values)).toMatch(
      /^CHECK \(kind IN \('bleach', .*'fake-kind'\)\)$/,
    );
  });
});
