// An admin invites a new person through the team screen, reads the captured invite in the
// outbox screen, and the invited person follows its link, chooses a password, lands in the
// shell with their role's tabs and can sign in again; the admin then removes them.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, screenshot, signIn, startE2e, visibleTabs, type E2e } from './harness';

let e2e: E2e;

beforeAll(async () => {
  e2e = await startE2e();
});

afterAll(async () => {
  await e2e?.stop();
});

describe('invite by e-mail', () => {
  it('invite → mail in the outbox → set password → signed in as the invited role → removed', async () => {
    const email = `wren-student-${Date.now()}@trimwire.test`;
    const password = 'larkspur-bench-42';
    const admin = await e2e.newPage('wide');
    try {
      const page = admin.page;
      await signIn(page, 'admin@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('bench-screen').waitFor();
      await page.getByTestId('tab-team').click();
      await page.getByTestId('member-list').waitFor();

      await page.getByTestId('invite-email').fill(email);
      await page.getByTestId('invite-role-viewer').click();
      await page.getByTestId('invite-submit').click();
      await expect(page.getByTestId('invite-result').innerText()).resolves.toContain(`Invite sent to ${email}`);
      await page.getByTestId(`invite-${email}`).waitFor();
      await screenshot(page, 'team-invited', 'admin', 'wide');

      // The captured mail appears on the outbox screen.
      await page.getByTestId('team-section-outbox').click();
      const row = page.locator('[data-testid^="outbox-message-"]', { hasText: email }).first();
      await row.waitFor({ timeout: 15_000 });
      await row.click();
      const text = await page.getByTestId('outbox-message-text').innerText();
      await screenshot(page, 'outbox', 'admin', 'wide');
      const link = text.match(/https?:\/\/\S+\/set-password\?token=[^\s)>"']+/)?.[0];
      expect(link, `set-password link in:\n${text}`).toBeTruthy();
      expect(new URL(link!).origin).toBe(e2e.baseUrl);

      // The invited person, in their own browser on a phone.
      const invited = await e2e.newPage('phone');
      try {
        await invited.page.goto(link!);
        await invited.page.getByTestId('set-password-screen').waitFor();
        await screenshot(invited.page, 'set-password', 'invited', 'phone');
        // Too short first: the page says so and stays.
        await invited.page.getByTestId('set-password-password').fill('short');
        await invited.page.getByTestId('set-password-confirm').fill('short');
        await invited.page.getByTestId('set-password-submit').click();
        await invited.page.getByTestId('set-password-password-error').waitFor();
        await invited.page.getByTestId('set-password-password').fill(password);
        await invited.page.getByTestId('set-password-confirm').fill(password);
        await invited.page.getByTestId('set-password-submit').click();
        await invited.page.getByTestId('lessons-screen').waitFor();
        expect(await visibleTabs(invited.page)).toEqual(['lessons', 'account']);

        // The link works once.
        await invited.page.getByTestId('tab-account').click();
        await invited.page.getByTestId('sign-out').click();
        await invited.page.getByTestId('sign-in-screen').waitFor();
        await invited.page.goto(link!);
        await invited.page.getByTestId('set-password-password').fill(password);
        await invited.page.getByTestId('set-password-confirm').fill(password);
        await invited.page.getByTestId('set-password-submit').click();
        await expect(invited.page.getByTestId('set-password-error').innerText()).resolves.toMatch(/expired or has already been used/);

        // The new password signs in.
        await signIn(invited.page, email, password);
        await invited.page.getByTestId('lessons-screen').waitFor();
      } finally {
        await invited.context.close();
      }

      // The admin sees the new member and removes them.
      await page.getByTestId('team-section-members').click();
      await page.reload();
      await page.getByTestId(`member-${email}`).click();
      await page.getByTestId('member-detail').waitFor();
      await page.getByTestId('member-remove').click();
      await page.getByTestId('member-remove-confirm').click();
      await page.getByTestId('member-placeholder').waitFor();
      expect(await page.getByTestId(`member-${email}`).count()).toBe(0);
      await screenshot(page, 'team', 'admin-after-remove', 'wide');
    } finally {
      await admin.context.close();
    }
  });
});
