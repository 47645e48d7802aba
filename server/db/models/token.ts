// Single-use e-mailed tokens: invites (join a team, set a password) and password resets.
// Only a SHA-256 of the token is stored, so a database leak does not leak working links.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '@/shared/domain/roles';

export type TokenKind = 'invite' | 'reset';

export class Token extends Model<InferAttributes<Token>, InferCreationAttributes<Token>> {
  declare id: CreationOptional<string>;
  declare kind: TokenKind;
  declare tokenHash: string;
  declare email: string;
  declare userId: string | null;
  declare teamId: string | null;
  declare role: Role | null;
  declare createdBy: string | null;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Token.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        kind: { type: DataTypes.TEXT, allowNull: false },
        tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
        email: { type: DataTypes.TEXT, allowNull: false },
        userId: { type: DataTypes.UUID, allowNull: true },
        teamId: { type: DataTypes.UUID, allowNull: true },
        role: { type: DataTypes.TEXT, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'tokens', underscored: true },
    );
  }
}
