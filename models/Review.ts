import { REVIEW_STATES, type ReviewState } from "./Signature";
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** How a history row came about: a lead's decision, carried from the same band's previous run, held back, or an undo. */
export const REVIEW_ORIGINS = ["decision", "carried", "not-carried", "undo"] as const;
export type ReviewOrigin = (typeof REVIEW_ORIGINS)[number];

export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
  declare id: CreationOptional<string>;
  declare signatureId: string;
  declare reviewerId: string | null;
  /** The state this row set; "awaiting" only for an undo back to awaiting or a decision held back. */
  declare decision: ReviewState;
  declare comment: CreationOptional<string>;
  declare origin: CreationOptional<ReviewOrigin>;
  /** The signature's state before this row. */
  declare previousState: CreationOptional<ReviewState | null>;
  declare carriedFromSignatureId: CreationOptional<string | null>;
  declare carriedFromRunId: CreationOptional<string | null>;
  declare undoesReviewId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    Review.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        signatureId: { type: DataTypes.UUID, allowNull: false },
        reviewerId: { type: DataTypes.UUID, allowNull: true },
        decision: { type: DataTypes.ENUM(...REVIEW_STATES), allowNull: false },
        comment: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        origin: { type: DataTypes.ENUM(...REVIEW_ORIGINS), allowNull: false, defaultValue: "decision" },
        previousState: { type: DataTypes.ENUM(...REVIEW_STATES), allowNull: true },
        carriedFromSignatureId: { type: DataTypes.UUID, allowNull: true },
        carriedFromRunId: { type: DataTypes.UUID, allowNull: true },
        undoesReviewId: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Review", tableName: "reviews", updatedAt: false },
    );
  }
}
