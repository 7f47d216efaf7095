import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const SERIES_KINDS = ["titration", "shell-thickness", "time", "other"] as const;
export type SeriesKind = (typeof SERIES_KINDS)[number];

export class Series extends Model<InferAttributes<Series>, InferCreationAttributes<Series>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare name: string;
  declare kind: CreationOptional<SeriesKind>;
  declare variableName: CreationOptional<string>;
  declare variableUnit: CreationOptional<string>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    Series.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        projectId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        kind: { type: DataTypes.ENUM(...SERIES_KINDS), allowNull: false, defaultValue: "other" },
        variableName: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        variableUnit: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Series", tableName: "series" },
    );
  }
}
