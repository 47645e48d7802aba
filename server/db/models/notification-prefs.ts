// Which e-mails a person wants; no row means the defaults (everything on).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class NotificationPrefs extends Model<InferAttributes<NotificationPrefs>, InferCreationAttributes<NotificationPrefs>> {
  declare userId: string;
  declare reviewRequests: boolean;
  declare decisions: boolean;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    NotificationPrefs.init(
      {
        userId: { type: DataTypes.UUID, primaryKey: true },
        reviewRequests: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        decisions: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'notification_prefs', underscored: true, createdAt: false },
    );
  }
}
