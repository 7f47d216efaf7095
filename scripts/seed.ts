// npm run seed: loads the demo scenario once (a second run finds it and does nothing).
// An invented lab, its samples and synthetic spectra with known features, uploaded
// through the same ingest path as real files so the worker analyses them.
import bcrypt from "bcryptjs";
import { loadActor, type Actor } from "../lib/auth/actor";
import { closeDb, selectRows, sequelize } from "../lib/db";
import { absorptionCsv, emissionCsv, leadChalcogenideCsv, midIrCsv, supernatantCsv } from "../lib/demo/synthetic";
import { dotExtinction } from "../lib/fits/dotExtinction";
import { hazardClassOf } from "../lib/hazards";
import { ingestFiles } from "../lib/ingest";
import { analysisQueue } from "../lib/queue";
import { setSupernatantLink } from "../lib/series/supernatantLinks";
import { Group, Membership, Project, Sample, SampleParent, Series, Share, Spectrum, User } from "../models";
import type { Role } from "../models/Membership";

export const DEMO_PASSWORD = "bandkeep-demo";

const db = sequelize();

const E1 = 2.148; // first exciton of the demo CdSe, near 577 nm

/** Uploads one demo file through the ingest path, as `who` (the ingest refuses nothing the demo makes). */
function uploader(actor: Actor) {
  return async (fileName: string, text: string, metadata: Record<string, unknown>, who = actor) => {
    const [outcome] = await ingestFiles(who, metadata, [{ fileName, bytes: new TextEncoder().encode(text), contentType: "text/csv" }]);
    if (!outcome.ok) throw new Error(`demo upload ${fileName} was refused: ${outcome.error.message}`);
    return outcome.spectrumId;
  };
}

async function alreadySeeded(): Promise<boolean> {
  return (await Group.count({ where: { slug: "aurora" } })) > 0;
}

async function seed() {
  const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
  const person = (email: string, name: string, isSiteAdmin = false) => User.create({ email, name, passwordHash: hash, isSiteAdmin });

  const lead = await person("lead@aurora-lab.test", "Mira Castellan", true);
  const spectro = await person("spectro@aurora-lab.test", "Tomas Eberlin");
  const steward = await person("steward@aurora-lab.test", "Ines Valdoro");
  const guest = await person("guest@partner-uni.test", "Kei Arnsworth");
  const other = await person("spectro@borealis-lab.test", "Pavel Lindqvist");

  const aurora = await Group.create({ name: "Aurora Nanocrystal Lab", slug: "aurora" });
  const borealis = await Group.create({ name: "Borealis Quantum Materials", slug: "borealis" });
  const member = (groupId: string, userId: string, role: Role) => Membership.create({ groupId, userId, role });
  await member(aurora.id, lead.id, "lead");
  await member(aurora.id, spectro.id, "spectroscopist");
  await member(aurora.id, steward.id, "steward");
  await member(aurora.id, guest.id, "collaborator");
  await member(borealis.id, other.id, "spectroscopist");

  const transfer = await Project.create({
    groupId: aurora.id,
    name: "Interdot charge transfer",
    description: "CdSe acceptor dots titrated with PbS donor dots; reduced CdSe as a charged reference.",
  });
  const shells = await Project.create({
    groupId: aurora.id,
    name: "Shell growth calibration",
    description: "CdSe cores before shell growth.",
  });
  const borealisProject = await Project.create({
    groupId: borealis.id,
    name: "Perovskite-free emitters",
    description: "Another group's data: invisible to Aurora.",
  });

  const sample = async (
    groupId: string,
    projectId: string,
    name: string,
    material: string,
    extra: Partial<{ coreShell: string; ligand: string; solvent: string; notes: string }> = {},
    createdBy = spectro.id,
  ) => Sample.create({ groupId, projectId, name, material, ...extra, hazardClass: hazardClassOf({ material, ...extra }), createdBy });
  const cdse = await sample(aurora.id, transfer.id, "AUR-CdSe-0412", "CdSe", {
    ligand: "oleate",
    solvent: "hexane",
    notes: "Hot-injection batch, first exciton near 577 nm.",
  });
  const pbs = await sample(aurora.id, transfer.id, "AUR-PbS-0415", "PbS", { ligand: "oleate", solvent: "toluene" });
  const reduced = await sample(aurora.id, transfer.id, "AUR-CdSe-0412-n", "CdSe", {
    ligand: "oleate",
    solvent: "hexane",
    notes: "Chemically reduced aliquot of AUR-CdSe-0412 (air-free).",
  });
  const product = await sample(aurora.id, transfer.id, "AUR-CdSe:PbS-0420", "CdSe + PbS", {
    ligand: "oleate",
    solvent: "hexane",
    notes: "Product of the 1:1 titration point.",
  });
  const cores = await sample(aurora.id, shells.id, "AUR-CdSe-core-0501", "CdSe", {
    coreShell: "CdSe core for CdSe/ZnS",
    ligand: "TOPO",
    solvent: "toluene",
  });
  await SampleParent.bulkCreate([
    { sampleId: reduced.id, parentId: cdse.id },
    { sampleId: product.id, parentId: cdse.id },
    { sampleId: product.id, parentId: pbs.id },
  ]);
  const otherSample = await sample(borealis.id, borealisProject.id, "BOR-InP-0007", "InP/ZnSe", { solvent: "toluene" }, other.id);

  const titration = await Series.create({
    projectId: transfer.id,
    name: "CdSe + PbS titration",
    kind: "titration",
    variableName: "PbS per CdSe",
    variableUnit: "equivalents",
    createdBy: spectro.id,
  });
  const plSeries = await Series.create({
    projectId: transfer.id,
    name: "CdSe PL quench by PbS",
    kind: "titration",
    variableName: "PbS concentration",
    variableUnit: "µM",
    createdBy: spectro.id,
  });
  await Share.create({
    groupId: aurora.id,
    targetType: "series",
    targetId: titration.id,
    granteeUserId: guest.id,
    linkTokenHash: null,
    expiresAt: null,
    revokedAt: null,
    createdBy: steward.id,
  });

  const actor = await loadActor(spectro.id, "session");
  const otherActor = await loadActor(other.id, "session");
  if (!actor || !otherActor) throw new Error("demo users were not created");
  const upload = uploader(actor);

  const base = { projectId: transfer.id, technique: "absorption", material: "CdSe", pathLengthCm: 1, solvent: "hexane" };
  const parentAbs = await upload("cdse-0412-abs.csv", absorptionCsv({ firstExcitonEv: E1, seed: 11 }, "AUR-CdSe-0412"), {
    ...base,
    sampleId: cdse.id,
  });
  await upload(
    "cdse-0412-n-abs.csv",
    absorptionCsv(
      { firstExcitonEv: E1, bleach: 0.42, newBand: { centreEv: 1.72, height: 0.05, sigmaEv: 0.08 }, seed: 12 },
      "AUR-CdSe-0412-n",
    ),
    { ...base, sampleId: reduced.id, referenceSpectrumId: parentAbs },
  );
  await upload("cdse-0412-stark.csv", absorptionCsv({ firstExcitonEv: E1, shiftMeV: -14, seed: 13 }, "AUR-CdSe-0412 near PbS film"), {
    ...base,
    sampleId: cdse.id,
    referenceSpectrumId: parentAbs,
  });
  await upload("cdse-0412-repeat.csv", absorptionCsv({ firstExcitonEv: E1, seed: 14 }, "AUR-CdSe-0412 repeat"), {
    ...base,
    sampleId: cdse.id,
    referenceSpectrumId: parentAbs,
  });

  // Titration: the bleach grows with added PbS and saturates at one equivalent (1:1 product).
  for (const eq of [0.25, 0.5, 0.75, 1, 1.5, 2]) {
    const bleach = 0.45 * Math.min(eq, 1);
    await upload(
      `titration-${eq.toFixed(2)}eq.csv`,
      absorptionCsv({ firstExcitonEv: E1, bleach, seed: 100 + Math.round(eq * 100) }, `titration ${eq} eq`),
      { ...base, sampleId: product.id, referenceSpectrumId: parentAbs, seriesId: titration.id, seriesValue: eq },
    );
  }

  // PL quench following Stern–Volmer, F0/F = 1 + K·[Q] with K = 0.08 µM⁻¹.
  const plBase = { projectId: transfer.id, technique: "pl", material: "CdSe", excitationNm: 405, solvent: "hexane" };
  const plParent = await upload("cdse-0412-pl.csv", emissionCsv({ peakEv: 2.1, intensity: 20000, seed: 21 }, "AUR-CdSe-0412"), {
    ...plBase,
    sampleId: cdse.id,
    seriesId: plSeries.id,
    seriesValue: 0,
  });
  for (const q of [2.5, 5, 10, 20]) {
    await upload(
      `pl-quench-${q}uM.csv`,
      emissionCsv({ peakEv: 2.1, intensity: 20000 / (1 + 0.08 * q), seed: 200 + q * 10 }, `PL with ${q} µM PbS`),
      { ...plBase, sampleId: product.id, referenceSpectrumId: plParent, seriesId: plSeries.id, seriesValue: q },
    );
  }

  // Mid-IR: the reduced dots show the 1Se→1Pe intraband band near 0.27 eV.
  const irBase = { projectId: transfer.id, technique: "ir", material: "CdSe" };
  const irParent = await upload("cdse-0412-midir.csv", midIrCsv({ seed: 31 }, "AUR-CdSe-0412"), { ...irBase, sampleId: cdse.id });
  await upload("cdse-0412-n-midir.csv", midIrCsv({ intrabandEv: 0.27, seed: 32 }, "AUR-CdSe-0412-n"), {
    ...irBase,
    sampleId: reduced.id,
    referenceSpectrumId: irParent,
  });

  await upload("cdse-core-0501-abs.csv", absorptionCsv({ firstExcitonEv: 2.25, seed: 41 }, "AUR-CdSe-core-0501"), {
    ...base,
    projectId: shells.id,
    sampleId: cores.id,
  });
  await upload(
    "inp-0007-abs.csv",
    absorptionCsv({ firstExcitonEv: 2.3, seed: 51 }, "BOR-InP-0007"),
    { projectId: borealisProject.id, technique: "absorption", sampleId: otherSample.id, pathLengthCm: 1 },
    otherActor,
  );
}

/**
 * Supernatant depletion for the demo titration: 0.5 µM CdSe in every mixture binds PbS 1:1, so
 * what is left is CdSe below one equivalent and PbS above it. Each point gets the absorption
 * spectrum of its supernatant (Beer–Lambert absorbances with each dot's sizing-curve ε, the two
 * dots' shapes added), linked to the point, and the pure PbS dots get a spectrum of their own.
 * Added on its own, once: a demo loaded before this step gets it on the next seed run.
 */
async function seedSupernatants(): Promise<number> {
  const titration = await Series.findOne({ where: { name: "CdSe + PbS titration" } });
  const spectro = await User.findOne({ where: { email: "spectro@aurora-lab.test" } });
  const pbs = await Sample.findOne({ where: { name: "AUR-PbS-0415" } });
  const product = await Sample.findOne({ where: { name: "AUR-CdSe:PbS-0420" } });
  if (!titration || !spectro || !pbs || !product) return 0;
  const [{ n }] = await selectRows<{ n: string }>(
    `SELECT count(*) AS n FROM spectra p JOIN spectra s ON s.supernatant_of_spectrum_id = p.id WHERE p.series_id = :id`,
    { id: titration.id },
  );
  if (Number(n) > 0) return 0;
  const actor = await loadActor(spectro.id, "session");
  if (!actor) throw new Error("the demo spectroscopist could not be loaded");
  const upload = uploader(actor);
  const base = { projectId: titration.projectId, technique: "absorption", pathLengthCm: 1 };
  const pbsExcitonEv = 1.033; // near 1200 nm
  await upload(
    "pbs-0415-abs.csv",
    leadChalcogenideCsv({ firstExcitonEv: pbsExcitonEv, scale: 2, noise: 0.0005, seed: 61 }, "AUR-PbS-0415"),
    { ...base, sampleId: pbs.id, material: "PbS", solvent: "toluene" },
  );

  const cdseNm = 1239.841984 / E1;
  const epsA = dotExtinction("CdSe", cdseNm).epsilonPerMPerCm; // Yu 2003, at the first exciton
  const epsX = dotExtinction("PbS", 1239.841984 / pbsExcitonEv).epsilonPerMPerCm; // Moreels 2009, at 400 nm
  const addedA = 0.5; // µM of CdSe in every mixture
  const points = await Spectrum.findAll({ where: { seriesId: titration.id }, order: [["seriesValue", "ASC"]] });
  for (const point of points) {
    const eq = point.seriesValue ?? 0;
    const leftA = addedA * Math.max(0, 1 - eq);
    const leftX = addedA * Math.max(0, eq - 1);
    const text = supernatantCsv(
      {
        cdse: { firstExcitonEv: E1, atNm: cdseNm, absorbance: epsA * leftA * 1e-6 },
        pbs: { firstExcitonEv: pbsExcitonEv, atNm: 400, absorbance: epsX * leftX * 1e-6 },
        noise: 0.0005,
        seed: 300 + Math.round(eq * 100),
      },
      `supernatant of titration ${eq} eq`,
    );
    const id = await upload(`titration-${eq.toFixed(2)}eq-supernatant.csv`, text, { ...base, sampleId: product.id, solvent: "hexane" });
    await setSupernatantLink(actor, titration.id, { supernatantSpectrumId: id, pointSpectrumId: point.id });
  }
  return points.length + 1;
}

try {
  if (await alreadySeeded()) {
    console.log("demo scenario already loaded");
  } else {
    await db.transaction(async () => undefined); // fail early if the database is unreachable
    await seed();
    console.log("demo scenario loaded: 2 groups, 5 people, 7 samples, 19 spectra queued for analysis");
  }
  const added = await seedSupernatants();
  if (added > 0)
    console.log(`demo supernatant depletion loaded: ${added} absorption spectra queued, ${added - 1} linked to the titration's points`);
} catch (error) {
  console.error(`seeding failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
} finally {
  await analysisQueue().close();
  await closeDb();
  process.exit();
}
