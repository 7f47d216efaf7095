import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const DATA_CLASSES = ["raw", "processed", "drafts"] as const;
export type DataClass = (typeof DATA_CLASSES)[number];

export class RetentionPolicy extends Model<InferAttributes<RetentionPolicy>, InferCreationAttributes<RetentionPolicy>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare dataClass: DataClass;
  declare keepDays: number;
  declare onExpiry: "delete" | "flag";
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    RetentionPolicy.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        projectId: { type: DataTypes.UUID, allowNull: false },
        dataClass: { type: DataTypes.ENUM(...DATA_CLASSES), allowNull: false },
        keepDays: { type: DataTypes.INTEGER, allowNull: false },
        onExpiry: { type: DataTypes.ENUM("delete", "flag"), allowNull: false },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "RetentionPolicy", tableName: "retention_policies" },
    );
  }
}
