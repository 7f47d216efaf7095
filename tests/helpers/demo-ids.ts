import { Op } from "sequelize";
import { Project, Series, Signature, Spectrum } from "@/models";

/** Ids of records from the demo scenario (scripts/seed.ts), looked up by their names. */
export async function demoIds() {
  const byName = async <T>(finder: Promise<T | null>, what: string): Promise<T> => {
    const row = await finder;
    if (!row) throw new Error(`demo scenario is missing ${what}: did scripts/seed.ts run?`);
    return row;
  };
  const project = await byName(Project.findOne({ where: { name: "Interdot charge transfer" } }), "the Aurora project");
  const sharedSeries = await byName(Series.findOne({ where: { name: "CdSe + PbS titration" } }), "the shared titration series");
  const privateSeries = await byName(Series.findOne({ where: { name: "CdSe PL quench by PbS" } }), "the PL series");
  const privateSpectrum = await byName(Spectrum.findOne({ where: { fileName: "cdse-0412-abs.csv" } }), "the parent absorption spectrum");
  const sharedSpectrum = await byName(Spectrum.findOne({ where: { fileName: "titration-1.00eq.csv" } }), "a titration spectrum");
  const otherGroupSpectrum = await byName(Spectrum.findOne({ where: { fileName: "inp-0007-abs.csv" } }), "the other group's spectrum");
  const sharedPoints = await Spectrum.findAll({ where: { seriesId: sharedSeries.id }, attributes: ["id"] });
  const pointIds = sharedPoints.map((p) => p.id);
  const sharedSupernatant = await byName(
    Spectrum.findOne({ where: { supernatantOfSpectrumId: { [Op.in]: pointIds } } }),
    "a supernatant of the shared titration",
  );
  const sharedSignature = await byName(
    Signature.findOne({ where: { spectrumId: { [Op.in]: pointIds }, supersededAt: null } }),
    "a flag of the shared titration",
  );
  return { project, sharedSeries, privateSeries, privateSpectrum, sharedSpectrum, otherGroupSpectrum, sharedSupernatant, sharedSignature };
}
