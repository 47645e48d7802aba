// Registers every model on one Sequelize instance and wires the associations.
import type { Sequelize } from 'sequelize';
import { Assumption } from '@/server/db/models/assumption';
import { AuditEntry } from '@/server/db/models/audit-entry';
import { Board } from '@/server/db/models/board';
import { Comment } from '@/server/db/models/comment';
import { Decision } from '@/server/db/models/decision';
import { Design } from '@/server/db/models/design';
import { Lesson } from '@/server/db/models/lesson';
import { LessonShareLink } from '@/server/db/models/lesson-share-link';
import { Membership } from '@/server/db/models/membership';
import { NotificationPrefs } from '@/server/db/models/notification-prefs';
import { OutboxMessage } from '@/server/db/models/outbox-message';
import { Proposal } from '@/server/db/models/proposal';
import { Revision } from '@/server/db/models/revision';
import { Scan } from '@/server/db/models/scan';
import { Team } from '@/server/db/models/team';
import { Token } from '@/server/db/models/token';
import { User } from '@/server/db/models/user';

export { AuditEntry, Membership, NotificationPrefs, OutboxMessage, Team, Token, User };
export { Assumption, Board, Comment, Decision, Design, Proposal, Revision, Scan };
export { Lesson, LessonShareLink };

export const models = {
  AuditEntry, Membership, NotificationPrefs, OutboxMessage, Team, Token, User,
  // Review workflow.
  Assumption, Board, Comment, Decision, Design, Proposal, Revision, Scan,
  // Lessons.
  Lesson, LessonShareLink,
};
export type Models = typeof models;

export function initModels(sequelize: Sequelize): Models {
  for (const m of Object.values(models)) m.initModel(sequelize);
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Membership.belongsTo(Team, { foreignKey: 'teamId', as: 'team' });
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });
  Team.hasMany(Membership, { foreignKey: 'teamId', as: 'memberships' });
  return models;
}
