// One proposal a scan left: the engine's proposal (edit, savings, verification, margins), the
// assumptions it relies on, its verdict and readiness, review status and overlapping proposals.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Edit } from '@/optimizer/rules/types';
import type { Verification } from '@/optimizer/rules/scan';
import type { MarginResult } from '@/optimizer/margins/corners';
import type { ProposalStatus, Savings } from '@/shared/api/proposals';

export class Proposal extends Model<InferAttributes<Proposal>, InferCreationAttributes<Proposal>> {
  declare id: CreationOptional<string>;
  declare scanId: string;
  declare designId: string;
  declare revisionId: string;
  declare revisionNumber: number;
  declare engineId: string;
  declare ruleId: string;
  declare title: string;
  declare message: string;
  declare location: { devices: string[]; instances: string[]; nets: string[] };
  declare edit: Edit;
  declare savings: Savings;
  declare savingsParts: number;
  declare verification: Verification;
  declare margins: MarginResult[];
  declare assumptionIds: string[];
  declare verdict: 'proved' | 'refuted' | 'unverified';
  declare marginStatus: 'pass' | 'warn' | 'fail';
  declare readiness: 'ready' | 'failing-margins' | 'refuted' | 'unverified';
  declare status: CreationOptional<ProposalStatus>;
  declare overlapsWith: CreationOptional<string[]>;
  declare boardIds: CreationOptional<string[]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Proposal.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        scanId: { type: DataTypes.UUID, allowNull: false },
        designId: { type: DataTypes.UUID, allowNull: false },
        revisionId: { type: DataTypes.UUID, allowNull: false },
        revisionNumber: { type: DataTypes.INTEGER, allowNull: false },
        engineId: { type: DataTypes.TEXT, allowNull: false },
        ruleId: { type: DataTypes.TEXT, allowNull: false },
        title: { type: DataTypes.TEXT, allowNull: false },
        message: { type: DataTypes.TEXT, allowNull: false },
        location: { type: DataTypes.JSONB, allowNull: false },
        edit: { type: DataTypes.JSONB, allowNull: false },
        savings: { type: DataTypes.JSONB, allowNull: false },
        savingsParts: { type: DataTypes.INTEGER, allowNull: false },
        verification: { type: DataTypes.JSONB, allowNull: false },
        margins: { type: DataTypes.JSONB, allowNull: false },
        assumptionIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
        verdict: { type: DataTypes.TEXT, allowNull: false },
        marginStatus: { type: DataTypes.TEXT, allowNull: false },
        readiness: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'open' },
        overlapsWith: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
        boardIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'proposals', underscored: true },
    );
  }
}
