import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

// Append-only: the database trigger refuses UPDATE and DELETE on this table.
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>;
  declare at: CreationOptional<Date>;
  declare actorId: string | null;
  declare actorLabel: CreationOptional<string>;
  declare groupId: string | null;
  declare action: string;
  declare targetType: string | null;
  declare targetId: string | null;
  declare details: CreationOptional<Record<string, unknown>>;

  static initialize(sequelize: Sequelize) {
    AuditEvent.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        actorId: { type: DataTypes.UUID, allowNull: true },
        actorLabel: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        groupId: { type: DataTypes.UUID, allowNull: true },
        action: { type: DataTypes.TEXT, allowNull: false },
        targetType: { type: DataTypes.TEXT, allowNull: true },
        targetId: { type: DataTypes.TEXT, allowNull: true },
        details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      },
      { sequelize, modelName: "AuditEvent", tableName: "audit_events", timestamps: false },
    );
  }
}
