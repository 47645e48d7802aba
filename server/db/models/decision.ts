// A reviewer's recorded decision on a proposal (a rejection always carries its reason).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Decision extends Model<InferAttributes<Decision>, InferCreationAttributes<Decision>> {
  declare id: CreationOptional<string>;
  declare proposalId: string;
  declare reviewerId: string | null;
  declare reviewerEmail: string;
  declare decision: 'accept' | 'reject';
  declare reason: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Decision.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        proposalId: { type: DataTypes.UUID, allowNull: false },
        reviewerId: { type: DataTypes.UUID, allowNull: true },
        reviewerEmail: { type: DataTypes.TEXT, allowNull: false },
        decision: { type: DataTypes.TEXT, allowNull: false },
        reason: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'decisions', underscored: true, updatedAt: false },
    );
  }
}
