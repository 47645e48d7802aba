// The signed-in person's own name and notification choices.
import type { Db } from '@/server/db';
import type { User } from '@/server/db/models';
import type { AccountPatchBody, AccountResponse } from '@/shared/api/account';

export async function getAccount(db: Db, user: User): Promise<AccountResponse> {
  const prefs = await db.models.NotificationPrefs.findByPk(user.id);
  return {
    user: { id: user.id, email: user.email, name: user.name },
    notifications: { reviewRequests: prefs?.reviewRequests ?? true, decisions: prefs?.decisions ?? true },
  };
}

export async function updateAccount(db: Db, user: User, patch: AccountPatchBody): Promise<AccountResponse> {
  await db.sequelize.transaction(async (transaction) => {
    if (patch.name !== undefined) await user.update({ name: patch.name }, { transaction });
    if (patch.notifications) {
      const current = await db.models.NotificationPrefs.findByPk(user.id, { transaction });
      await db.models.NotificationPrefs.upsert(
        {
          userId: user.id,
          reviewRequests: patch.notifications.reviewRequests ?? current?.reviewRequests ?? true,
          decisions: patch.notifications.decisions ?? current?.decisions ?? true,
        },
        { transaction },
      );
    }
  });
  return getAccount(db, user);
}
