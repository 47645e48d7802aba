// A share link of a lesson: the sha256 of its random token (the token itself is never stored),
// public or team-only, optional expiry, and when it was revoked.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class LessonShareLink extends Model<InferAttributes<LessonShareLink>, InferCreationAttributes<LessonShareLink>> {
  declare id: CreationOptional<string>;
  declare lessonId: string;
  declare tokenHash: string;
  declare public: boolean;
  declare expiresAt: Date | null;
  declare revokedAt: CreationOptional<Date | null>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    LessonShareLink.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        lessonId: { type: DataTypes.UUID, allowNull: false },
        tokenHash: { type: DataTypes.TEXT, allowNull: false },
        public: { type: DataTypes.BOOLEAN, allowNull: false },
        expiresAt: { type: DataTypes.DATE, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'lesson_share_links', underscored: true, updatedAt: false },
    );
  }
}
