import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class Share extends Model<InferAttributes<Share>, InferCreationAttributes<Share>> {
  declare id: CreationOptional<string>;
  declare groupId: string;
  declare targetType: "project" | "series";
  declare targetId: string;
  declare granteeUserId: string | null;
  declare linkTokenHash: string | null;
  declare expiresAt: Date | null;
  declare revokedAt: Date | null;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    Share.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        groupId: { type: DataTypes.UUID, allowNull: false },
        targetType: { type: DataTypes.ENUM("project", "series"), allowNull: false },
        targetId: { type: DataTypes.UUID, allowNull: false },
        granteeUserId: { type: DataTypes.UUID, allowNull: true },
        linkTokenHash: { type: DataTypes.CHAR(64), allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Share", tableName: "shares", updatedAt: false },
    );
  }
}
