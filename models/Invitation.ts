import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import { ROLES, type Role } from "./Membership";

/** An e-mailed, one-time invitation; only the sha256 of its token is stored. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare groupId: string;
  declare email: string;
  declare role: Role;
  declare shareTargetType: "project" | "series" | null;
  declare shareTargetId: string | null;
  declare tokenHash: string;
  declare invitedBy: string | null;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare acceptedBy: string | null;
  declare revokedAt: Date | null;
  declare createdAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    Invitation.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        groupId: { type: DataTypes.UUID, allowNull: false },
        email: { type: DataTypes.TEXT, allowNull: false },
        role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
        shareTargetType: { type: DataTypes.ENUM("project", "series"), allowNull: true },
        shareTargetId: { type: DataTypes.UUID, allowNull: true },
        tokenHash: { type: DataTypes.CHAR(64), allowNull: false },
        invitedBy: { type: DataTypes.UUID, allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        acceptedBy: { type: DataTypes.UUID, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Invitation", tableName: "invitations", updatedAt: false },
    );
  }
}
