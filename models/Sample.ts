import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class Sample extends Model<InferAttributes<Sample>, InferCreationAttributes<Sample>> {
  declare id: CreationOptional<string>;
  declare groupId: string;
  declare projectId: string | null;
  declare name: string;
  declare material: string;
  declare coreShell: CreationOptional<string>;
  declare ligand: CreationOptional<string>;
  declare solvent: CreationOptional<string>;
  declare hazardClass: CreationOptional<string>;
  declare notes: CreationOptional<string>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    Sample.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        groupId: { type: DataTypes.UUID, allowNull: false },
        projectId: { type: DataTypes.UUID, allowNull: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        material: { type: DataTypes.TEXT, allowNull: false },
        coreShell: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        ligand: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        solvent: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        hazardClass: { type: DataTypes.TEXT, allowNull: false, defaultValue: "none" },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Sample", tableName: "samples" },
    );
  }
}
