import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare name: string;
  declare tokenHash: string;
  declare prefix: string;
  declare lastUsedAt: Date | null;
  declare revokedAt: Date | null;
  /** null: never expires (migration 0006). */
  declare expiresAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    ApiToken.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        userId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
        prefix: { type: DataTypes.TEXT, allowNull: false },
        lastUsedAt: { type: DataTypes.DATE, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: "ApiToken", tableName: "api_tokens", updatedAt: false },
    );
  }
}
