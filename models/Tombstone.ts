import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { DataClass } from "./RetentionPolicy";

export type TombstoneState = "pending" | "done" | "cancelled";
export type TombstoneTarget = "spectrum" | "analysis-run";
export type DeletionCause = "policy" | "steward" | "owner";

/** What was deleted, when, why and its sha256; a pending one is an unfinished deletion. */
export class Tombstone extends Model<InferAttributes<Tombstone>, InferCreationAttributes<Tombstone>> {
  declare id: CreationOptional<string>;
  declare groupId: string;
  declare projectId: string;
  declare policyId: string | null;
  declare dataClass: DataClass;
  declare targetType: TombstoneTarget;
  declare targetId: string;
  declare label: CreationOptional<string>;
  declare objectKey: string | null;
  declare sha256: string | null;
  declare sizeBytes: CreationOptional<number>;
  declare cause: DeletionCause;
  declare actorId: string | null;
  declare state: CreationOptional<TombstoneState>;
  declare details: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;
  declare completedAt: Date | null;

  static initialize(sequelize: Sequelize) {
    Tombstone.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        groupId: { type: DataTypes.UUID, allowNull: false },
        projectId: { type: DataTypes.UUID, allowNull: false },
        policyId: { type: DataTypes.UUID, allowNull: true },
        dataClass: { type: DataTypes.ENUM("raw", "processed", "drafts"), allowNull: false },
        targetType: { type: DataTypes.ENUM("spectrum", "analysis-run"), allowNull: false },
        targetId: { type: DataTypes.UUID, allowNull: false },
        label: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        objectKey: { type: DataTypes.TEXT, allowNull: true },
        sha256: { type: DataTypes.CHAR(64), allowNull: true },
        sizeBytes: {
          type: DataTypes.BIGINT,
          allowNull: false,
          defaultValue: 0,
          get() {
            return Number(this.getDataValue("sizeBytes"));
          },
        },
        cause: { type: DataTypes.TEXT, allowNull: false },
        actorId: { type: DataTypes.UUID, allowNull: true },
        state: { type: DataTypes.ENUM("pending", "done", "cancelled"), allowNull: false, defaultValue: "pending" },
        details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        createdAt: DataTypes.DATE,
        completedAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, modelName: "Tombstone", tableName: "tombstones", updatedAt: false },
    );
  }
}
