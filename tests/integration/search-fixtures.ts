import { randomUUID, createHash } from "node:crypto";
import { QueryTypes } from "sequelize";
import { selectRows, sequelize } from "@/lib/db";

// Rows whose truth the search tests know: a project of the demo's Aurora group with two samples
// and spectra whose peaks, flags and sizes are written here (not computed by the engine), so each
// filter's right answer follows from this file alone. Energies come from E = hc/λ with
// hc = 1239.841984 eV·nm (CODATA 2018) and from 1 cm⁻¹ = 1.239841984e-4 eV.

const HC = 1239.841984;
export const evOfNm = (nm: number) => HC / nm;
export const evOfWavenumber = (cm: number) => cm * 1.239841984e-4;

type PeakSpec = { nm?: number; wavenumber?: number; height: number; first?: boolean };
type RunSpec = {
  status: "done" | "failed";
  at: string;
  peaks?: PeakSpec[];
  diameterNm?: number;
  flags?: { kind: string; magnitude: number; significance: number; review?: string }[];
};
type SpectrumSpec = {
  key: string;
  technique: "absorption" | "pl" | "ir";
  sample: "cdse" | "pbs" | null;
  fileName: string;
  at: string;
  status?: string;
  uploader: "lead" | "spectroscopist";
  metadata?: Record<string, string>;
  material?: string;
  runs?: RunSpec[];
};

export const FIXTURE_SPECTRA: SpectrumSpec[] = [
  {
    key: "a1",
    technique: "absorption",
    sample: "cdse",
    fileName: "cdse-a-001.csv",
    at: "2026-03-05T10:00:00Z",
    uploader: "lead",
    material: "CdSe",
    metadata: { operator_note: "glovebox transfer" },
    runs: [
      {
        status: "done",
        at: "2026-03-05T10:01:00Z",
        diameterNm: 3.6,
        peaks: [
          { nm: 580, height: 0.5, first: true },
          { nm: 480, height: 0.7 },
          { nm: 420, height: 0.9 },
        ],
        flags: [{ kind: "bleach", magnitude: 0.25, significance: 8 }],
      },
    ],
  },
  // its newest run moved the first exciton to 600 nm; the superseded run's 575 nm must not be found
  {
    key: "a2",
    technique: "absorption",
    sample: "cdse",
    fileName: "cdse-a-002.csv",
    at: "2026-03-06T10:00:00Z",
    uploader: "lead",
    material: "CdSe",
    runs: [
      {
        status: "done",
        at: "2026-03-06T10:01:00Z",
        diameterNm: 3.5,
        peaks: [{ nm: 575, height: 0.5, first: true }],
        flags: [{ kind: "bleach", magnitude: 0.4, significance: 20 }],
      },
      {
        status: "done",
        at: "2026-03-06T11:00:00Z",
        diameterNm: 4.2,
        peaks: [{ nm: 600, height: 0.5, first: true }],
        flags: [{ kind: "bleach", magnitude: 0.15, significance: 12, review: "confirmed" }],
      },
    ],
  },
  {
    key: "a3",
    technique: "absorption",
    sample: "pbs",
    fileName: "pbs-7-abs.csv",
    at: "2026-03-07T10:00:00Z",
    uploader: "lead",
    material: "PbS",
    runs: [
      {
        status: "done",
        at: "2026-03-07T10:01:00Z",
        diameterNm: 4.0,
        peaks: [{ nm: 1300, height: 0.3, first: true }],
        flags: [{ kind: "bleach", magnitude: 0.3, significance: 2 }],
      },
    ],
  },
  // emission maximum at 595 nm; the 560 nm band is a band but not the maximum
  {
    key: "p1",
    technique: "pl",
    sample: "cdse",
    fileName: "cdse-a-pl.csv",
    at: "2026-03-08T10:00:00Z",
    uploader: "lead",
    material: "CdSe",
    runs: [
      {
        status: "done",
        at: "2026-03-08T10:01:00Z",
        peaks: [
          { nm: 595, height: 10 },
          { nm: 560, height: 3 },
        ],
        flags: [{ kind: "pl-quench", magnitude: 0.5, significance: 30 }],
      },
    ],
  },
  {
    key: "i1",
    technique: "ir",
    sample: "pbs",
    fileName: "pbs-7-ligands.jdx",
    at: "2026-03-09T10:00:00Z",
    uploader: "lead",
    runs: [
      {
        status: "done",
        at: "2026-03-09T10:01:00Z",
        peaks: [
          { wavenumber: 2920, height: 0.4 },
          { wavenumber: 1710, height: 0.2 },
        ],
      },
    ],
  },
  {
    key: "f1",
    technique: "absorption",
    sample: null,
    fileName: "broken-export.txt",
    at: "2025-01-10T10:00:00Z",
    uploader: "spectroscopist",
    status: "failed",
  },
  // the only analysis failed: no first exciton to find
  {
    key: "a4",
    technique: "absorption",
    sample: "cdse",
    fileName: "cdse-a-003.csv",
    at: "2026-03-09T10:00:00Z",
    uploader: "lead",
    material: "CdSe",
    runs: [{ status: "failed", at: "2026-03-09T10:01:00Z", peaks: [{ nm: 585, height: 0.5, first: true }] }],
  },
];

export type SearchFixture = {
  projectId: string;
  sampleIds: Record<"cdse" | "pbs", string>;
  ids: Record<string, string>;
  leadId: string;
  spectroscopistId: string;
};

const q = (sql: string, replacements: Record<string, unknown>) => sequelize().query(sql, { replacements, type: QueryTypes.SELECT });
const one = async <T extends object>(sql: string, replacements: Record<string, unknown>) => (await q(sql, replacements))[0] as T;

export async function createSearchFixture(tag: string): Promise<SearchFixture> {
  const [group] = await selectRows<{ id: string }>("SELECT id FROM groups WHERE slug = 'aurora'");
  const users = await selectRows<{ id: string; email: string }>(
    "SELECT id, email FROM users WHERE email IN ('lead@aurora-lab.test', 'spectro@aurora-lab.test')",
  );
  const leadId = users.find((u) => u.email.startsWith("lead"))!.id;
  const spectroscopistId = users.find((u) => u.email.startsWith("spectro"))!.id;
  const project = await one<{ id: string }>("INSERT INTO projects (group_id, name) VALUES (:g, :n) RETURNING id", {
    g: group!.id,
    n: `Search fixture ${tag}`,
  });
  const sampleIds = {
    cdse: (
      await one<{ id: string }>(
        "INSERT INTO samples (group_id, project_id, name, material, notes) VALUES (:g, :p, :n, 'CdSe', 'hot injection, oleic acid capped') RETURNING id",
        { g: group!.id, p: project.id, n: `QD-CdSe-batch-A-${tag}` },
      )
    ).id,
    pbs: (
      await one<{ id: string }>(
        "INSERT INTO samples (group_id, project_id, name, material, notes) VALUES (:g, :p, :n, 'PbS', 'cation exchange from CdS') RETURNING id",
        { g: group!.id, p: project.id, n: `QD-PbS-7-${tag}` },
      )
    ).id,
  };
  const ids: Record<string, string> = {};
  for (const s of FIXTURE_SPECTRA) {
    const sha = createHash("sha256").update(`${tag}-${s.key}`).digest("hex");
    const row = await one<{ id: string }>(
      `INSERT INTO spectra (project_id, sample_id, technique, file_name, object_key, sha256, size_bytes, metadata, status, material, uploaded_by, created_at)
       VALUES (:p, :sample, :technique, :file, :key, :sha, 100, CAST(:meta AS jsonb), :status, :material, :uploader, :at) RETURNING id`,
      {
        p: project.id,
        sample: s.sample ? sampleIds[s.sample] : null,
        technique: s.technique,
        file: s.fileName,
        key: `search-fixture/${randomUUID()}`,
        sha,
        meta: JSON.stringify(s.metadata ?? {}),
        status: s.status ?? (s.runs?.some((r) => r.status === "done") ? "analysed" : "failed"),
        material: s.material ?? null,
        uploader: s.uploader === "lead" ? leadId : spectroscopistId,
        at: s.at,
      },
    );
    ids[s.key] = row.id;
    for (const [i, run] of (s.runs ?? []).entries()) {
      const report = { derived: { diameterNm: run.diameterNm ?? null } };
      const r = await one<{ id: string }>(
        `INSERT INTO analysis_runs (spectrum_id, engine_version, parameter_hash, status, report, created_at)
         VALUES (:s, 'fixture', :hash, :status, CAST(:report AS jsonb), :at) RETURNING id`,
        {
          s: row.id,
          hash: createHash("sha256").update(`${tag}-${s.key}-${i}`).digest("hex"),
          status: run.status,
          report: JSON.stringify(report),
          at: run.at,
        },
      );
      for (const p of run.peaks ?? []) {
        const ev = p.nm ? evOfNm(p.nm) : evOfWavenumber(p.wavenumber!);
        await q("INSERT INTO peaks (run_id, energy_ev, wavelength_nm, height, is_first_exciton) VALUES (:r, :ev, :nm, :h, :first)", {
          r: r.id,
          ev,
          nm: HC / ev,
          h: p.height,
          first: p.first ?? false,
        });
      }
      for (const f of run.flags ?? []) {
        await q(
          `INSERT INTO signatures (run_id, spectrum_id, kind, fraction, significance, details, review_state)
                 VALUES (:r, :s, :kind, :m, :sig, CAST(:details AS jsonb), :review)`,
          {
            r: r.id,
            s: row.id,
            kind: f.kind,
            m: f.magnitude,
            sig: f.significance,
            details: JSON.stringify({ magnitude: f.magnitude }),
            review: f.review ?? "awaiting",
          },
        );
      }
    }
  }
  return { projectId: project.id, sampleIds, ids, leadId, spectroscopistId };
}

export async function dropSearchFixture(f: SearchFixture): Promise<void> {
  await q("DELETE FROM spectra WHERE project_id = :p", { p: f.projectId });
  await q("DELETE FROM samples WHERE project_id = :p", { p: f.projectId });
  await q("DELETE FROM saved_searches WHERE query LIKE :like", { like: `%${f.projectId}%` });
  await q("DELETE FROM projects WHERE id = :p", { p: f.projectId });
}
