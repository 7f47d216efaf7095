import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
  declare id: CreationOptional<string>;
  declare signatureId: string;
  declare reviewerId: string | null;
  declare decision: "confirmed" | "dismissed";
  declare comment: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    Review.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        signatureId: { type: DataTypes.UUID, allowNull: false },
        reviewerId: { type: DataTypes.UUID, allowNull: true },
        decision: { type: DataTypes.ENUM("confirmed", "dismissed"), allowNull: false },
        comment: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Review", tableName: "reviews", updatedAt: false },
    );
  }
}
