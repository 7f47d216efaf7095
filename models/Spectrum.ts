import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { ReadChoice } from "@/lib/engine/parse/readChoice";

import { TECHNIQUES, type Technique } from "@/lib/registry/techniques";

/** The techniques (lib/registry/techniques.ts); the database checks them (migrations/0005). */
export { TECHNIQUES, type Technique };
export const SPECTRUM_STATUSES = ["received", "queued", "analysing", "analysed", "failed"] as const;
export type SpectrumStatus = (typeof SPECTRUM_STATUSES)[number];

export class Spectrum extends Model<InferAttributes<Spectrum>, InferCreationAttributes<Spectrum>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare sampleId: string | null;
  declare seriesId: string | null;
  declare seriesValue: number | null;
  declare referenceSpectrumId: string | null;
  /** For the supernatant of a titration point: that point's spectrum (migrations/0004 states the rules). */
  declare supernatantOfSpectrumId: CreationOptional<string | null>;
  declare technique: Technique;
  declare fileName: string;
  /** Several spectra may share one object: the traces of one file (migrations/0010). */
  declare objectKey: string;
  declare sha256: string;
  /** Which trace of the file this spectrum is: '' for the file's default reading (lib/ingest/traceKey.ts). */
  declare traceKey: CreationOptional<string>;
  declare sizeBytes: number;
  declare contentType: CreationOptional<string>;
  declare columnChoice: string | null;
  /** Block, pair, sheet, chosen X unit or Y kind (migrations/0008); the column stays in columnChoice. */
  declare readOptions: CreationOptional<ReadChoice>;
  declare axisUnit: string | null;
  declare valueUnit: string | null;
  declare pathLengthCm: number | null;
  declare excitationNm: number | null;
  declare slitNm: number | null;
  declare integrationMs: number | null;
  declare solvent: CreationOptional<string>;
  declare material: string | null;
  declare metadata: CreationOptional<Record<string, unknown>>;
  declare status: CreationOptional<SpectrumStatus>;
  declare errorMessage: string | null;
  declare uploadedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    // A fresh object per column: Sequelize writes the column name into the object it is given.
    const optionalNumber = () => ({ type: DataTypes.DOUBLE, allowNull: true });
    Spectrum.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        projectId: { type: DataTypes.UUID, allowNull: false },
        sampleId: { type: DataTypes.UUID, allowNull: true },
        seriesId: { type: DataTypes.UUID, allowNull: true },
        seriesValue: optionalNumber(),
        referenceSpectrumId: { type: DataTypes.UUID, allowNull: true },
        supernatantOfSpectrumId: { type: DataTypes.UUID, allowNull: true },
        technique: { type: DataTypes.TEXT, allowNull: false },
        fileName: { type: DataTypes.TEXT, allowNull: false },
        objectKey: { type: DataTypes.TEXT, allowNull: false },
        sha256: { type: DataTypes.CHAR(64), allowNull: false },
        traceKey: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        sizeBytes: {
          type: DataTypes.BIGINT,
          allowNull: false,
          get() {
            return Number(this.getDataValue("sizeBytes"));
          },
        },
        contentType: { type: DataTypes.TEXT, allowNull: false, defaultValue: "application/octet-stream" },
        columnChoice: { type: DataTypes.TEXT, allowNull: true },
        readOptions: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        axisUnit: { type: DataTypes.TEXT, allowNull: true },
        valueUnit: { type: DataTypes.TEXT, allowNull: true },
        pathLengthCm: optionalNumber(),
        excitationNm: optionalNumber(),
        slitNm: optionalNumber(),
        integrationMs: optionalNumber(),
        solvent: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        material: { type: DataTypes.TEXT, allowNull: true },
        metadata: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        status: { type: DataTypes.ENUM(...SPECTRUM_STATUSES), allowNull: false, defaultValue: "received" },
        errorMessage: { type: DataTypes.TEXT, allowNull: true },
        uploadedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Spectrum", tableName: "spectra" },
    );
  }
}
