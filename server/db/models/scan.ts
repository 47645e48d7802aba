// A scan job's row: status, progress and stage (written by the worker as it goes), the heartbeat
// the sweeper watches, the cancel flag the worker checks between stages, timings and errors.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ScanStatus } from '@/shared/api/scans';

export class Scan extends Model<InferAttributes<Scan>, InferCreationAttributes<Scan>> {
  declare id: CreationOptional<string>;
  declare designId: string;
  declare revisionId: string;
  declare revisionNumber: number;
  declare status: CreationOptional<ScanStatus>;
  declare progress: CreationOptional<number>;
  declare stage: CreationOptional<string>;
  declare rules: string[] | null;
  declare startedBy: string | null;
  declare cancelRequested: CreationOptional<boolean>;
  declare attempts: CreationOptional<number>;
  declare worker: CreationOptional<string | null>;
  declare heartbeatAt: CreationOptional<Date | null>;
  declare jobId: CreationOptional<string | null>;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare timings: CreationOptional<Record<string, number>>;
  declare engineVersion: string;
  declare error: CreationOptional<string | null>;
  declare ruleErrors: CreationOptional<{ ruleId: string; message: string }[]>;
  declare proposalCount: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Scan.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        designId: { type: DataTypes.UUID, allowNull: false },
        revisionId: { type: DataTypes.UUID, allowNull: false },
        revisionNumber: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
        progress: { type: DataTypes.REAL, allowNull: false, defaultValue: 0 },
        stage: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
        rules: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: true },
        startedBy: { type: DataTypes.UUID, allowNull: true },
        cancelRequested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        worker: { type: DataTypes.TEXT, allowNull: true },
        heartbeatAt: { type: DataTypes.DATE, allowNull: true },
        jobId: { type: DataTypes.TEXT, allowNull: true },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        finishedAt: { type: DataTypes.DATE, allowNull: true },
        timings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        engineVersion: { type: DataTypes.TEXT, allowNull: false },
        error: { type: DataTypes.TEXT, allowNull: true },
        ruleErrors: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        proposalCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'scans', underscored: true },
    );
  }
}
