// One immutable revision of a design: the source text as uploaded (or as written by an apply),
// its hash, format, parsed summary and part counts.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Format } from '@/optimizer/netlist/ir';
import type { PartCounts } from '@/shared/api/revisions';

export type RevisionSummary = {
  title: string;
  top: string;
  cells: number;
  instances: number;
  nets: number;
  devices: number;
  /** Top-level instance names (board prefixes are chosen from these). */
  topInstances: string[];
  warnings: { code: string; message: string; line: number | null; col: number | null }[];
};

export class Revision extends Model<InferAttributes<Revision>, InferCreationAttributes<Revision>> {
  declare id: CreationOptional<string>;
  declare designId: string;
  declare number: number;
  declare format: Format;
  declare fileName: string;
  declare source: string;
  declare sha256: string;
  declare summary: RevisionSummary;
  declare partCounts: PartCounts;
  declare note: string | null;
  declare appliedProposals: CreationOptional<string[]>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Revision.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        designId: { type: DataTypes.UUID, allowNull: false },
        number: { type: DataTypes.INTEGER, allowNull: false },
        format: { type: DataTypes.TEXT, allowNull: false },
        fileName: { type: DataTypes.TEXT, allowNull: false },
        source: { type: DataTypes.TEXT, allowNull: false },
        sha256: { type: DataTypes.TEXT, allowNull: false },
        summary: { type: DataTypes.JSONB, allowNull: false },
        partCounts: { type: DataTypes.JSONB, allowNull: false },
        note: { type: DataTypes.TEXT, allowNull: true },
        appliedProposals: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'revisions', underscored: true, updatedAt: false },
    );
  }
}
