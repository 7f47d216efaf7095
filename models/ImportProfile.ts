import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A project's saved way of reading files of one instrument or export habit (migrations/0010). */
export class ImportProfile extends Model<InferAttributes<ImportProfile>, InferCreationAttributes<ImportProfile>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare name: string;
  /** Checked by lib/ingest/profiles/profileChoice.ts wherever it is read or written. */
  declare choice: Record<string, unknown>;
  /** The header signature of the file it was saved from (lib/ingest/profiles/headerSignature.ts). */
  declare signature: string;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    ImportProfile.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        projectId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        choice: { type: DataTypes.JSONB, allowNull: false },
        signature: { type: DataTypes.TEXT, allowNull: false },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "ImportProfile", tableName: "import_profiles" },
    );
  }
}
