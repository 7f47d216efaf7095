import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class SampleParent extends Model<InferAttributes<SampleParent>, InferCreationAttributes<SampleParent>> {
  declare sampleId: string;
  declare parentId: string;

  static initialize(sequelize: Sequelize) {
    SampleParent.init(
      {
        sampleId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        parentId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
      },
      { sequelize, modelName: "SampleParent", tableName: "sample_parents", timestamps: false },
    );
  }
}
