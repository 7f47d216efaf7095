import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare passwordHash: string;
  declare isSiteAdmin: CreationOptional<boolean>;
  declare notifyDigest: CreationOptional<boolean>;
  declare notifyDecisions: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialize(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        email: {
          type: DataTypes.TEXT,
          allowNull: false,
          unique: true,
          set(v: string) {
            this.setDataValue("email", v.trim().toLowerCase());
          },
        },
        name: { type: DataTypes.TEXT, allowNull: false },
        passwordHash: { type: DataTypes.TEXT, allowNull: false },
        isSiteAdmin: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        notifyDigest: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        notifyDecisions: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "User", tableName: "users" },
    );
  }
}
