import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const HOLD_TARGETS = ["project", "series", "sample", "spectrum"] as const;
export type HoldTarget = (typeof HOLD_TARGETS)[number];

export class LegalHold extends Model<InferAttributes<LegalHold>, InferCreationAttributes<LegalHold>> {
  declare id: CreationOptional<string>;
  declare groupId: string;
  declare targetType: HoldTarget;
  declare targetId: string;
  declare reason: string;
  declare placedBy: string | null;
  declare placedAt: CreationOptional<Date>;
  declare liftedBy: string | null;
  declare liftedAt: Date | null;

  static initialize(sequelize: Sequelize) {
    LegalHold.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        groupId: { type: DataTypes.UUID, allowNull: false },
        targetType: { type: DataTypes.ENUM(...HOLD_TARGETS), allowNull: false },
        targetId: { type: DataTypes.UUID, allowNull: false },
        reason: { type: DataTypes.TEXT, allowNull: false },
        placedBy: { type: DataTypes.UUID, allowNull: true },
        placedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        liftedBy: { type: DataTypes.UUID, allowNull: true },
        liftedAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, modelName: "LegalHold", tableName: "legal_holds", timestamps: false },
    );
  }
}
