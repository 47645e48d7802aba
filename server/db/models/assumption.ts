// An operating assumption of a design (expression over net names), its owner and justification.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Assumption extends Model<InferAttributes<Assumption>, InferCreationAttributes<Assumption>> {
  declare id: CreationOptional<string>;
  declare designId: string;
  declare expression: string;
  declare justification: string;
  declare ownerId: string | null;
  declare status: CreationOptional<'active' | 'withdrawn'>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Assumption.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        designId: { type: DataTypes.UUID, allowNull: false },
        expression: { type: DataTypes.TEXT, allowNull: false },
        justification: { type: DataTypes.TEXT, allowNull: false },
        ownerId: { type: DataTypes.UUID, allowNull: true },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'active' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'assumptions', underscored: true },
    );
  }
}
