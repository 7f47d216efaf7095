import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const RUN_STATUSES = ["queued", "running", "done", "failed"] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

export class AnalysisRun extends Model<InferAttributes<AnalysisRun>, InferCreationAttributes<AnalysisRun>> {
  declare id: CreationOptional<string>;
  declare spectrumId: string;
  declare referenceSpectrumId: string | null;
  declare engineVersion: string;
  declare parameterHash: string;
  declare parameters: CreationOptional<Record<string, unknown>>;
  declare status: CreationOptional<RunStatus>;
  declare errorMessage: string | null;
  declare noise: number | null;
  declare report: unknown;
  declare requestedBy: string | null;
  declare startedAt: Date | null;
  declare finishedAt: Date | null;
  declare durationMs: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    AnalysisRun.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        spectrumId: { type: DataTypes.UUID, allowNull: false },
        referenceSpectrumId: { type: DataTypes.UUID, allowNull: true },
        engineVersion: { type: DataTypes.TEXT, allowNull: false },
        parameterHash: { type: DataTypes.CHAR(64), allowNull: false },
        parameters: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        status: { type: DataTypes.ENUM(...RUN_STATUSES), allowNull: false, defaultValue: "queued" },
        errorMessage: { type: DataTypes.TEXT, allowNull: true },
        noise: { type: DataTypes.DOUBLE, allowNull: true },
        report: { type: DataTypes.JSONB, allowNull: true },
        requestedBy: { type: DataTypes.UUID, allowNull: true },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        finishedAt: { type: DataTypes.DATE, allowNull: true },
        durationMs: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "AnalysisRun", tableName: "analysis_runs" },
    );
  }
}
