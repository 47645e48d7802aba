// Signs in through the real sign-in page as each demo role, at a phone size and a wide size, and
// checks the shell shows exactly that role's tabs (bottom tabs on phones, side rail when wide),
// that tabs outside the role redirect, and that signing out returns to sign-in; plus the
// not-found page and the password reset request.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, screenshot, signIn, startE2e, visibleTabs, type E2e, type SizeName } from './harness';

// The role → tab table from the product brief (issue 2), written out by hand rather than read
// from the code under test.
const EXPECTED_TABS = {
  admin: ['bench', 'sign-off', 'lessons', 'team', 'account'],
  designer: ['bench', 'lessons', 'account'],
  reviewer: ['bench', 'sign-off', 'account'],
  educator: ['bench', 'lessons', 'account'],
  viewer: ['lessons', 'account'],
} as const;
type RoleName = keyof typeof EXPECTED_TABS;

const ROLES = Object.keys(EXPECTED_TABS) as RoleName[];
const SIZE_NAMES: SizeName[] = ['phone', 'wide'];

let e2e: E2e;

beforeAll(async () => {
  e2e = await startE2e();
});

afterAll(async () => {
  await e2e?.stop();
});

describe.each(SIZE_NAMES)('at %s size', (size) => {
  it('sends a signed-out visitor to sign-in', async () => {
    const { context, page } = await e2e.newPage(size);
    try {
      await page.goto('/account');
      await page.getByTestId('sign-in-screen').waitFor();
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      await screenshot(page, 'sign-in', 'signed-out', size);
    } finally {
      await context.close();
    }
  });

  it('shows the not-found page for an unknown address', async () => {
    const { context, page } = await e2e.newPage(size);
    try {
      await page.goto('/no-such-place');
      await page.getByTestId('not-found-screen').waitFor();
      await screenshot(page, 'not-found', 'signed-out', size);
    } finally {
      await context.close();
    }
  });

  it('asks for a password reset from the sign-in page', async () => {
    const { context, page } = await e2e.newPage(size);
    try {
      await page.goto('/sign-in');
      await page.getByTestId('sign-in-forgot').click();
      await page.getByTestId('forgot-password-screen').waitFor();
      await page.getByTestId('forgot-password-email').fill('educator@trimwire.test');
      await page.getByTestId('forgot-password-submit').click();
      await expect(page.getByTestId('forgot-password-sent').innerText()).resolves.toContain('educator@trimwire.test');
      await screenshot(page, 'forgot-password', 'signed-out', size);
    } finally {
      await context.close();
    }
  });

  it('refuses a wrong password with a sentence, on the page', async () => {
    const { context, page } = await e2e.newPage(size);
    try {
      await signIn(page, 'designer@trimwire.test', 'not-the-password');
      await expect(page.getByTestId('sign-in-error').innerText()).resolves.toMatch(/do not match an account/);
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      await screenshot(page, 'sign-in-error', 'designer', size);
    } finally {
      await context.close();
    }
  });

  it.each(ROLES)('%s signs in and sees their tabs', async (role) => {
    const { context, page } = await e2e.newPage(size);
    try {
      await signIn(page, `${role}@trimwire.test`, DEMO_PASSWORD);
      const home = EXPECTED_TABS[role][0];
      await page.getByTestId(`${home}-screen`).waitFor();
      expect(new URL(page.url()).pathname).toBe(`/${home}`);
      await page.getByTestId(size === 'wide' ? 'side-rail' : 'tab-bar').waitFor();
      expect(await page.getByTestId(size === 'wide' ? 'tab-bar' : 'side-rail').count()).toBe(0);
      expect(await visibleTabs(page)).toEqual(EXPECTED_TABS[role]);

      for (const tab of EXPECTED_TABS[role]) {
        await page.getByTestId(`tab-${tab}`).click();
        await page.getByTestId(`${tab}-screen`).waitFor();
        expect(new URL(page.url()).pathname).toBe(`/${tab}`);
        if (tab === 'account') await page.getByTestId('account-email').waitFor();
        if (tab === 'team') await page.getByTestId('member-list').waitFor();
        await screenshot(page, tab, role, size);
      }

      // A signed-in person is sent away from the sign-in page.
      await page.goto('/sign-in');
      await page.getByTestId(`${home}-screen`).waitFor();
      expect(new URL(page.url()).pathname).toBe(`/${home}`);
    } finally {
      await context.close();
    }
  });
});

describe('role guards and sign-out', () => {
  it('a viewer who opens the team address lands on their own first tab', async () => {
    const { context, page } = await e2e.newPage('phone');
    try {
      await signIn(page, 'viewer@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('lessons-screen').waitFor();
      await page.goto('/team');
      await page.getByTestId('lessons-screen').waitFor();
      expect(new URL(page.url()).pathname).toBe('/lessons');
      expect(await page.getByTestId('team-screen').count()).toBe(0);
    } finally {
      await context.close();
    }
  });

  it.each(SIZE_NAMES)('signing out at %s size ends the session', async (size) => {
    const { context, page } = await e2e.newPage(size);
    try {
      await signIn(page, 'reviewer@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('bench-screen').waitFor();
      await page.getByTestId('tab-account').click();
      await page.getByTestId('sign-out').click();
      await page.getByTestId('sign-in-screen').waitFor();
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      // The server agrees: the session is gone, and a reload stays signed out.
      const me = await page.evaluate(() => fetch('/api/auth/me', { credentials: 'include' }).then((r) => r.status));
      expect(me).toBe(401);
      await page.goto('/bench');
      await page.getByTestId('sign-in-screen').waitFor();
    } finally {
      await context.close();
    }
  });
});
