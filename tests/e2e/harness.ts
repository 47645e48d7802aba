// End-to-end harness: serves the exported web build and the API from the product server against
// the test database (migrated and seeded with the demo team), makes sure the fake SMTP server is
// capturing mail, and drives Debian's Chromium through playwright-core.
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { startServer, type RunningServer } from '@/server/serve';
import { LOCAL_DATABASE_URLS } from '@/server/env';
import { migrate } from '@/server/db/migrate';
import { seedDemo, DEMO_PASSWORD } from '@/server/db/seed';
import { startFakeSmtp } from '@/server/mail/fake-smtp';

export { DEMO_PASSWORD };

const ROOT = path.resolve(__dirname, '../..');
export const SCREENSHOT_DIR = path.join(ROOT, 'tests/e2e/screenshots');

export const SIZES = {
  phone: { width: 390, height: 844 },
  wide: { width: 1280, height: 800 },
} as const;
export type SizeName = keyof typeof SIZES;

// Flags for Chromium running as root in a container (see STACK.md).
const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

export type E2e = {
  baseUrl: string;
  server: RunningServer;
  browser: Browser;
  newPage(size: SizeName): Promise<{ context: BrowserContext; page: Page }>;
  stop(): Promise<void>;
};

function portAnswers(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host: '127.0.0.1' });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}

// A free port chosen up front, because the invite links in mail must name the server's address
// before it starts, and a fixed port would collide with another run on the same machine.
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as net.AddressInfo;
      probe.close(() => resolve(port));
    });
  });
}

export async function startE2e(): Promise<E2e> {
  if (!fs.existsSync(path.join(ROOT, 'dist/index.html'))) {
    throw new Error('dist/index.html is missing: export the web build first (npm test does; by hand: EXPO_OFFLINE=1 EXPO_NO_TELEMETRY=1 CI=1 npx expo export --platform web).');
  }
  const port = process.env.E2E_PORT ? Number(process.env.E2E_PORT) : await freePort();
  const databaseUrl = process.env.DATABASE_URL ?? LOCAL_DATABASE_URLS.test;
  const smtpPort = Number(process.env.FAKE_SMTP_TEST_PORT ?? 2526);

  // scripts/test.sh starts the fake SMTP server; when run on their own the tests start one here.
  const ownSmtp = (await portAnswers(smtpPort)) ? null : await startFakeSmtp({ databaseUrl, port: smtpPort, host: '127.0.0.1' });

  const server = await startServer({
    port,
    env: {
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      DIST_DIR: path.join(ROOT, 'dist'),
      BCRYPT_COST: '4',
    },
  });
  await migrate(server.db.sequelize);
  await seedDemo(server.db, { nodeEnv: 'test', bcryptCost: 4 });

  // launch() gives every run a fresh temporary profile (user-data-dir), removed on close.
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS, headless: true });
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });

  // The first load of the bundle on a busy machine is the slowest; do it once before any test
  // so a cold browser cannot eat a test's time budget.
  const warm = await browser.newContext({ baseURL: server.url });
  try {
    const page = await warm.newPage();
    await page.goto('/sign-in', { timeout: 120_000 });
    await page.getByTestId('sign-in-screen').waitFor({ timeout: 120_000 });
  } finally {
    await warm.close();
  }

  return {
    baseUrl: server.url,
    server,
    browser,
    async newPage(size) {
      const context = await browser.newContext({ viewport: SIZES[size], baseURL: server.url, colorScheme: 'light', locale: 'en-GB' });
      // Two shared cores make single steps slow at times; a minute per step still catches a hang.
      context.setDefaultTimeout(60_000);
      const page = await context.newPage();
      return { context, page };
    },
    async stop() {
      await browser.close().catch(() => undefined);
      await server.close();
      if (ownSmtp) await ownSmtp.close();
    },
  };
}

export async function screenshot(page: Page, screen: string, who: string, size: SizeName): Promise<string> {
  const file = path.join(SCREENSHOT_DIR, `${screen}-${who}-${size}.png`);
  // Let fonts and layout settle so the picture shows what a person sees.
  await page.evaluate(() => document.fonts.ready.then(() => true));
  await page.screenshot({ path: file });
  return file;
}

export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
}

// The tab ids the shell shows, read from the page in display order.
export async function visibleTabs(page: Page): Promise<string[]> {
  await page.locator('[data-testid^="tab-"]').first().waitFor();
  const ids = await page.locator('[data-testid^="tab-"]').evaluateAll((els) => els.map((el) => el.getAttribute('data-testid') ?? ''));
  return ids.filter((id) => id !== 'tab-bar').map((id) => id.replace(/^tab-/, ''));
}
