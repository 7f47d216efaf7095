import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class Peak extends Model<InferAttributes<Peak>, InferCreationAttributes<Peak>> {
  declare id: CreationOptional<string>;
  declare runId: string;
  declare energyEv: number;
  declare wavelengthNm: number;
  declare height: number;
  declare fwhmMeV: number | null;
  declare area: number | null;
  declare isFirstExciton: CreationOptional<boolean>;

  static initialize(sequelize: Sequelize) {
    Peak.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        runId: { type: DataTypes.UUID, allowNull: false },
        energyEv: { type: DataTypes.DOUBLE, allowNull: false },
        wavelengthNm: { type: DataTypes.DOUBLE, allowNull: false },
        height: { type: DataTypes.DOUBLE, allowNull: false },
        fwhmMeV: { type: DataTypes.DOUBLE, allowNull: true, field: "fwhm_mev" },
        area: { type: DataTypes.DOUBLE, allowNull: true },
        isFirstExciton: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      },
      { sequelize, modelName: "Peak", tableName: "peaks", timestamps: false },
    );
  }
}
