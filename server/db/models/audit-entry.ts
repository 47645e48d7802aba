// One line of a team's audit log: who did what to whom, and when.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { AuditAction } from '@/shared/api/audit';

export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<string>;
  /** Null for events tied to no team (a failed sign-in with an unknown e-mail). */
  declare teamId: string | null;
  declare actorId: string | null;
  declare actorEmail: string | null;
  declare action: AuditAction;
  declare target: string | null;
  declare details: CreationOptional<Record<string, unknown>>;
  declare at: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    AuditEntry.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        teamId: { type: DataTypes.UUID, allowNull: true },
        actorId: { type: DataTypes.UUID, allowNull: true },
        actorEmail: { type: DataTypes.TEXT, allowNull: true },
        action: { type: DataTypes.TEXT, allowNull: false },
        target: { type: DataTypes.TEXT, allowNull: true },
        details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'audit_log', underscored: true, timestamps: false },
    );
  }
}
