// A lesson: a design revision, the proposals chosen from it, and Markdown notes in ordered sections;
// a draft (its author and admins see it) or published (the team sees it).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type LessonSection = { id: string; heading: string; body: string };

export class Lesson extends Model<InferAttributes<Lesson>, InferCreationAttributes<Lesson>> {
  declare id: CreationOptional<string>;
  declare teamId: string;
  declare designId: string;
  declare revisionId: string;
  declare authorId: string | null;
  declare title: string;
  declare status: CreationOptional<'draft' | 'published'>;
  declare proposalIds: CreationOptional<string[]>;
  declare sections: CreationOptional<LessonSection[]>;
  declare publishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Lesson.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        teamId: { type: DataTypes.UUID, allowNull: false },
        designId: { type: DataTypes.UUID, allowNull: false },
        revisionId: { type: DataTypes.UUID, allowNull: false },
        authorId: { type: DataTypes.UUID, allowNull: true },
        title: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft' },
        proposalIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
        sections: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        publishedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'lessons', underscored: true },
    );
  }
}
