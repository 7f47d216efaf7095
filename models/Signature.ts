import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

import { FLAG_KINDS, type FlagKind, type FlagUnit } from "@/lib/registry/flagKinds";

/** The flag kinds (lib/registry/flagKinds.ts); the database checks them (migrations/0005). */
export const SIGNATURE_KINDS = FLAG_KINDS;
export type SignatureKind = FlagKind;
export const REVIEW_STATES = ["awaiting", "confirmed", "dismissed"] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];

export class Signature extends Model<InferAttributes<Signature>, InferCreationAttributes<Signature>> {
  declare id: CreationOptional<string>;
  declare runId: string;
  declare spectrumId: string;
  declare kind: SignatureKind;
  declare energyEv: number | null;
  declare fraction: number | null;
  declare shiftMeV: number | null;
  /** The magnitude in its own unit (any kind); fraction and shiftMeV are kept for older readers. */
  declare magnitude: CreationOptional<number | null>;
  declare unit: CreationOptional<FlagUnit | null>;
  declare uncertainty: CreationOptional<number | null>;
  declare significance: number;
  declare details: CreationOptional<Record<string, unknown>>;
  declare reviewState: CreationOptional<ReviewState>;
  /** The same band in the run before this one (lib/review/matchSignatures.ts). */
  declare matchedSignatureId: CreationOptional<string | null>;
  /** Set when a newer finished run replaced this signature's run: it leaves the queue and every count. */
  declare supersededByRunId: CreationOptional<string | null>;
  declare supersededAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    Signature.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        runId: { type: DataTypes.UUID, allowNull: false },
        spectrumId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        energyEv: { type: DataTypes.DOUBLE, allowNull: true },
        fraction: { type: DataTypes.DOUBLE, allowNull: true },
        shiftMeV: { type: DataTypes.DOUBLE, allowNull: true, field: "shift_mev" },
        magnitude: { type: DataTypes.DOUBLE, allowNull: true },
        unit: { type: DataTypes.TEXT, allowNull: true },
        uncertainty: { type: DataTypes.DOUBLE, allowNull: true },
        significance: { type: DataTypes.DOUBLE, allowNull: false },
        details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        reviewState: { type: DataTypes.ENUM(...REVIEW_STATES), allowNull: false, defaultValue: "awaiting" },
        matchedSignatureId: { type: DataTypes.UUID, allowNull: true },
        supersededByRunId: { type: DataTypes.UUID, allowNull: true },
        supersededAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Signature", tableName: "signatures" },
    );
  }
}
