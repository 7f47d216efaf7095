import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { DataClass } from "./RetentionPolicy";
import type { TombstoneTarget } from "./Tombstone";

/** An expired item whose policy says "flag": it waits for the steward to keep or delete it. */
export class RetentionFlag extends Model<InferAttributes<RetentionFlag>, InferCreationAttributes<RetentionFlag>> {
  declare id: CreationOptional<string>;
  declare groupId: string;
  declare projectId: string;
  declare policyId: string | null;
  declare dataClass: DataClass;
  declare targetType: TombstoneTarget;
  declare targetId: string;
  declare label: CreationOptional<string>;
  declare flaggedAt: CreationOptional<Date>;
  declare decision: "keep" | "delete" | null;
  declare decidedBy: string | null;
  declare decidedAt: Date | null;

  static initialize(sequelize: Sequelize) {
    RetentionFlag.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        groupId: { type: DataTypes.UUID, allowNull: false },
        projectId: { type: DataTypes.UUID, allowNull: false },
        policyId: { type: DataTypes.UUID, allowNull: true },
        dataClass: { type: DataTypes.ENUM("raw", "processed", "drafts"), allowNull: false },
        targetType: { type: DataTypes.ENUM("spectrum", "analysis-run"), allowNull: false },
        targetId: { type: DataTypes.UUID, allowNull: false },
        label: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        flaggedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        decision: { type: DataTypes.TEXT, allowNull: true },
        decidedBy: { type: DataTypes.UUID, allowNull: true },
        decidedAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, modelName: "RetentionFlag", tableName: "retention_flags", timestamps: false },
    );
  }
}
