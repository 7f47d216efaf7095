import { describe, expect, it } from "vitest";
import { ingestMetadataSchema } from "@/lib/ingest/metadata";
import { canonicalJson } from "@/lib/ingest/canonicalJson";
import { columnChoice, materialFromText, mergeParameters, parameterHash, reanalysisSchema } from "@/lib/ingest/parameters";
import { cleanFileName } from "@/lib/ingest/storeFile";

const projectId = "3f0c2a4e-5b6d-4c7e-8f90-a1b2c3d4e5f6";

function issue(input: Record<string, unknown>) {
  const r = ingestMetadataSchema.safeParse(input);
  if (r.success) return null;
  return { field: r.error.issues[0].path.join("."), message: r.error.issues[0].message };
}

describe("ingest metadata schema", () => {
  it("accepts form strings, coerces numbers and drops blanks", () => {
    const r = ingestMetadataSchema.parse({
      projectId,
      technique: "pl",
      excitationNm: "405",
      pathLengthCm: "",
      solvent: "  toluene ",
      seriesId: projectId,
      seriesValue: "0.25",
    });
    expect(r).toEqual({ projectId, technique: "pl", excitationNm: 405, solvent: "toluene", seriesId: projectId, seriesValue: 0.25 });
  });

  it("names the field of every refusal", () => {
    expect(issue({ technique: "absorption" })?.field).toBe("projectId");
    expect(issue({ projectId, technique: "raman" })).toEqual({
      field: "technique",
      message: "technique must be one of absorption, pl, ir",
    });
    expect(issue({ projectId, technique: "pl", pathLengthCm: "abc" })?.field).toBe("pathLengthCm");
    expect(issue({ projectId, technique: "pl", pathLengthCm: "0" })?.message).toMatch(/above 0/);
    expect(issue({ projectId, technique: "pl", excitationNm: "Infinity" })?.field).toBe("excitationNm");
    expect(issue({ projectId, technique: "pl", seriesValue: "3" })).toEqual({
      field: "seriesValue",
      message: "seriesValue needs a seriesId",
    });
    expect(issue({ projectId, technique: "pl", sampleId: "12" })?.message).toBe("sampleId must be an id (UUID)");
  });

  it("refuses markup and control characters in text fields", () => {
    expect(issue({ projectId, technique: "pl", solvent: "<b>hexane</b>" })?.field).toBe("solvent");
    expect(issue({ projectId, technique: "pl", column: "a\u0000b" })?.field).toBe("column");
    expect(issue({ projectId, technique: "pl", solvent: "x".repeat(101) })?.message).toMatch(/longer than 100/);
  });
});

describe("analysis parameters", () => {
  it("canonical JSON sorts keys at every depth and drops undefined members", () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { y: 2, x: undefined, w: null }], c: "s" } })).toBe(
      '{"a":{"c":"s","d":[1,{"w":null,"y":2}]},"b":1}',
    );
    expect(() => canonicalJson({ a: Number.NaN })).toThrow(RangeError);
  });

  it("hashes equal parameters equally whatever the key order, and differently per reference", () => {
    const a = parameterHash({ technique: "absorption", material: "CdSe", pathLengthCm: 1 }, null);
    const b = parameterHash({ pathLengthCm: 1, material: "CdSe", technique: "absorption" }, null);
    expect(a).toBe(b);
    expect(a).toMatch(/^[0-9a-f]{64}$/);
    expect(parameterHash({ technique: "absorption", material: "CdSe", pathLengthCm: 1 }, projectId)).not.toBe(a);
    expect(parameterHash({ technique: "absorption", material: "CdSe", pathLengthCm: 2 }, null)).not.toBe(a);
  });

  it("merges re-analysis changes: absent keeps, null clears, thresholds merge", () => {
    const base = { technique: "absorption" as const, material: "CdSe" as const, pathLengthCm: 1, thresholds: { minSignificance: 5 } };
    const changes = reanalysisSchema.parse({ material: null, smoothingWindow: 11, thresholds: { minShiftMeV: 2 } });
    expect(mergeParameters(base, changes)).toEqual({
      technique: "absorption",
      pathLengthCm: 1,
      smoothingWindow: 11,
      thresholds: { minShiftMeV: 2, minSignificance: 5 },
    });
    expect(reanalysisSchema.safeParse({ smoothingWindow: 10 }).error?.issues[0].message).toBe("smoothingWindow must be odd");
    expect(reanalysisSchema.safeParse({ smoothingWindw: 11 }).success).toBe(false);
  });

  it("reads column choices and materials as people type them", () => {
    expect(columnChoice("2")).toBe(2);
    expect(columnChoice("abs 2")).toBe("abs 2");
    expect(columnChoice(undefined)).toBeUndefined();
    expect(materialFromText("CdSe/ZnS")).toBe("CdSe");
    expect(materialFromText("pbs (oleate)")).toBe("PbS");
    expect(materialFromText("InP/ZnS")).toBeUndefined();
  });

  it("cleans stored file names without losing folder paths", () => {
    expect(cleanFileName("run 3\\sample-a.csv")).toBe("run 3/sample-a.csv");
    expect(cleanFileName("/abs/path.csv")).toBe("abs/path.csv");
    expect(cleanFileName("a\u0000b\nc.csv")).toBe("abc.csv");
    expect(cleanFileName("")).toBe("unnamed");
    expect(cleanFileName("x".repeat(300) + ".csv")).toHaveLength(255);
  });
});
