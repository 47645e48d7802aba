// The review workflow in Chromium, end to end: the designer uploads a demo deck (after a broken
// one is refused with its line and column), states an assumption, scans and watches the progress,
// opens a proposal; a reviewer in a separate browser accepts one and rejects one with a reason;
// the review and decision e-mails reach the fake SMTP outbox; the designer applies the accepted
// proposal and downloads the new revision's SPICE-style deck, which ngspice loads without errors.
// Screens are photographed at phone and wide sizes.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD, screenshot, signIn, startE2e, type E2e, type SizeName } from './harness';
import { startScanWorker, type ScanWorker } from './scan-worker';

const ROOT = path.resolve(__dirname, '../..');
const DECK = path.join(ROOT, 'server/db/demo/wren8-register-slice.cir');
const DESIGN_NAME = `Wren-8 register slice, bench copy ${Date.now().toString(36)}`;
const REJECT_REASON = 'Keep the per-bit parts on this card until the bench check of the shared driver (demo decision).';

let e2e: E2e;
let worker: ScanWorker;
let tmp: string;

beforeAll(async () => {
  e2e = await startE2e();
  const smtpPort = process.env.FAKE_SMTP_TEST_PORT ?? '2526';
  worker = await startScanWorker({
    NODE_ENV: 'test',
    DATABASE_URL: e2e.server.env.DATABASE_URL,
    SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
    PUBLIC_URL: e2e.baseUrl,
    // Pause between stages so the progress can be seen while the scan runs.
    TRIMWIRE_SCAN_STAGE_DELAY_MS: '300',
  });
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-workflow-'));
});

afterAll(async () => {
  await worker?.stop();
  await e2e?.stop();
  if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

// The demo people want these e-mails; other suites sharing the test database may have turned
// them off, so the preference is set before the mail is due (what Account → Notifications does).
async function wantMail(email: string) {
  const { User, NotificationPrefs } = e2e.server.db.models;
  const user = await User.findOne({ where: { email } });
  if (!user) throw new Error(`no demo account ${email}`);
  await NotificationPrefs.upsert({ userId: user.id, reviewRequests: true, decisions: true });
}

async function chooseFile(page: Page, file: string) {
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByTestId('upload-pick').click()]);
  await chooser.setFiles(file);
  await expect.poll(() => page.getByTestId('upload-file-name').innerText()).toContain(path.basename(file));
}

type Outbox = { messages: { to: string; subject: string; text: string }[] };

async function waitForMail(page: Page, match: (m: Outbox['messages'][number]) => boolean, what: string) {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    const outbox = (await (await page.request.get('/api/team/outbox')).json()) as Outbox;
    const found = outbox.messages.find(match);
    if (found) return found;
    await page.waitForTimeout(500);
  }
  throw new Error(`no ${what} in the outbox within 30 s`);
}

describe('review workflow', () => {
  let designId = '';
  let designUrl = '';
  let acceptedTitle = '';

  it('designer: a broken deck is refused with its line and column and nothing is stored', async () => {
    const { page, context } = await e2e.newPage('wide');
    try {
      await signIn(page, 'designer@trimwire.test', DEMO_PASSWORD);
      // Other suites share the test database, so the team may have designs or none yet.
      await page.locator('[data-testid="design-list"], [data-testid="bench-empty"]').first().waitFor();
      await screenshot(page, 'bench', 'designer', 'wide');
      const before = ((await (await page.request.get('/api/designs')).json()) as { designs: unknown[] }).designs.length;

      await page.getByTestId('bench-upload').click();
      await page.getByTestId('upload-screen').waitFor();
      const broken = path.join(tmp, 'broken-slice.cir');
      fs.writeFileSync(broken, 'Broken slice\nR1 A B 1k\nQ1 C\n.end\n');
      await chooseFile(page, broken);
      await page.getByTestId('upload-name').fill('Broken slice');
      await page.getByTestId('upload-submit').click();
      const first = page.getByTestId('upload-diagnostic-0');
      await first.waitFor();
      // A located problem: file:line:col of the card the reader refused (the Q card is line 3).
      // Errors are listed before warnings.
      await expect(first.innerText()).resolves.toMatch(/broken-slice\.cir:3(:\d+)? · error/);
      await expect(page.getByTestId('upload-problem-summary').innerText()).resolves.toMatch(/Nothing was stored/);
      await screenshot(page, 'upload-error', 'designer', 'wide');
      const after = ((await (await page.request.get('/api/designs')).json()) as { designs: unknown[] }).designs.length;
      expect(after).toBe(before);
    } finally {
      await context.close();
    }
  });

  it('designer: uploads the demo deck, states an assumption, scans with live progress and opens a proposal', async () => {
    const { page, context } = await e2e.newPage('wide');
    try {
      await signIn(page, 'designer@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('bench-screen').waitFor();
      await page.goto('/designs/new');
      await chooseFile(page, DECK);
      await page.getByTestId('upload-name').fill(DESIGN_NAME);
      await page.getByTestId('upload-family-rtl').click();
      await page.getByTestId('upload-board').fill('Register card B');
      await page.getByTestId('upload-budget-parts').fill('30');
      await page.getByTestId('upload-budget-area').fill('900');
      await page.getByTestId('upload-budget-cost').fill('1.10');
      await screenshot(page, 'upload', 'designer', 'wide');
      await page.getByTestId('upload-submit').click();
      await page.getByTestId('design-overview').waitFor();
      await expect(page.getByTestId('design-name').innerText()).resolves.toBe(DESIGN_NAME);
      designId = new URL(page.url()).pathname.split('/')[2];
      designUrl = `/designs/${designId}`;
      // The deck's parts: 4 bits × (4 transistors, 6 resistors) + 4 load resistors (counted by hand).
      await expect(page.getByTestId('design-totals-transistors').innerText()).resolves.toContain('16');

      // An assumption the parser refuses points at its column; then the real one.
      await page.getByTestId('assumption-add').click();
      await page.getByTestId('assumption-expression').fill('!(CLR & )');
      await page.getByTestId('assumption-justification').fill('Clear and load are never active together (sequencer rule, demo scenario).');
      await page.getByTestId('assumption-save').click();
      await page.getByTestId('assumption-problem').waitFor();
      await screenshot(page, 'assumption-error', 'designer', 'wide');
      await page.getByTestId('assumption-expression').fill('!(CLR & LD)');
      await page.getByTestId('assumption-save').click();
      await page.getByTestId('assumption-note').waitFor();
      await expect(page.getByTestId('assumption-0').innerText()).resolves.toContain('!(CLR & LD)');

      // Scan, and watch it go through its stages.
      await wantMail('reviewer@trimwire.test');
      await page.getByTestId('scan-start').click();
      const seen = new Set<string>();
      const deadline = Date.now() + 150_000;
      while (Date.now() < deadline) {
        if (await page.getByTestId('scan-state-done').count()) break;
        for (const state of ['queued', 'running', 'failed', 'cancelled']) if (await page.getByTestId(`scan-state-${state}`).count()) seen.add(state);
        if (seen.has('failed') || seen.has('cancelled')) break;
        if (seen.has('running') && !seen.has('shot')) {
          const progress = await page.getByTestId('scan-progress').innerText().catch(() => '');
          if (/\d+%/.test(progress)) {
            seen.add('shot');
            await screenshot(page, 'scan-running', 'designer', 'wide');
          }
        }
        await page.waitForTimeout(250);
      }
      expect([...seen].filter((s) => s !== 'shot')).not.toContain('failed');
      expect(seen.has('running') || seen.has('queued')).toBe(true);
      await page.getByTestId('scan-state-done').waitFor();
      await expect(page.getByTestId('scan-result').innerText()).resolves.toMatch(/Found [1-9]\d* proposals?/);
      await screenshot(page, 'design', 'designer', 'wide');

      await page.getByTestId('scan-open-proposals').click();
      await page.getByTestId('proposals-list').waitFor();
      const rows = page.locator('[data-testid^="proposal-row-"][role="button"]');
      expect(await rows.count()).toBeGreaterThanOrEqual(2);
      await screenshot(page, 'proposals', 'designer', 'wide');
      await rows.first().click();
      await page.getByTestId('proposal-detail').waitFor();
      await page.getByTestId('proposal-evidence').waitFor();
      // A designer reads the evidence but has no decision to make.
      expect(await page.getByTestId('proposal-accept').count()).toBe(0);
      await screenshot(page, 'proposal', 'designer', 'wide');
    } finally {
      await context.close();
    }
  });

  it('reviewer (separate browser, phone): accepts one proposal and rejects another with a reason', async () => {
    expect(designId).not.toBe('');
    await wantMail('designer@trimwire.test');
    const { page, context } = await e2e.newPage('phone');
    try {
      await signIn(page, 'reviewer@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('bench-screen').waitFor();
      await page.getByTestId('tab-sign-off').click();
      await page.getByTestId('sign-off-list').waitFor();
      const ours = () => page.locator('[data-testid^="proposal-row-"][role="button"]', { hasText: DESIGN_NAME });
      await expect.poll(() => ours().count(), { timeout: 20_000 }).toBeGreaterThanOrEqual(2);
      await screenshot(page, 'sign-off', 'reviewer', 'phone');

      // Accept a proved one, with passing margins when there is one, so it is fit to apply.
      const proved = ours().filter({ hasText: 'Proved' });
      const choices = [proved.filter({ hasText: 'Margins pass' }), proved.filter({ hasText: 'Margins warn' }), proved, ours()];
      let pick = ours().first();
      for (const c of choices) {
        if (await c.count()) {
          pick = c.first();
          break;
        }
      }
      await pick.click();
      await page.getByTestId('proposal-detail').waitFor();
      acceptedTitle = await page.getByTestId('proposal-title').innerText();
      await screenshot(page, 'proposal', 'reviewer', 'phone');
      await page.getByTestId('proposal-accept').click();
      await expect(page.getByTestId('proposal-decision-result').innerText()).resolves.toMatch(/Accepted/);
      await expect(page.getByTestId('proposal-status').innerText()).resolves.toMatch(/Accepted/);
      await page.getByTestId('sign-off-back').click();

      // Reject another: without a reason the form says one is needed; with one it is recorded.
      await expect.poll(() => ours().count(), { timeout: 20_000 }).toBeGreaterThanOrEqual(1);
      await ours().first().click();
      await page.getByTestId('proposal-reject').click();
      await page.getByTestId('proposal-reason-error').waitFor();
      await page.getByTestId('proposal-reason').fill(REJECT_REASON);
      await page.getByTestId('proposal-reject').click();
      await expect(page.getByTestId('proposal-decision-result').innerText()).resolves.toMatch(/Rejected/);
      await expect(page.getByTestId('proposal-decision-0').innerText()).resolves.toContain(REJECT_REASON);
      await screenshot(page, 'proposal-rejected', 'reviewer', 'phone');
    } finally {
      await context.close();
    }
  });

  it('the review request and both decisions arrive as e-mail in the fake SMTP outbox', async () => {
    const { page, context } = await e2e.newPage('wide');
    try {
      await signIn(page, 'admin@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('bench-screen').waitFor();
      const request = await waitForMail(page, (m) => m.to === 'reviewer@trimwire.test' && m.subject.includes(DESIGN_NAME), 'review request to the reviewer');
      expect(request.subject).toMatch(/proposals? to review/);
      const accepted = await waitForMail(page, (m) => m.to === 'designer@trimwire.test' && m.subject.includes(acceptedTitle) && /accept/i.test(m.subject), 'acceptance mail to the designer');
      expect(accepted.text).toMatch(/\/proposals\//);
      const rejected = await waitForMail(page, (m) => m.to === 'designer@trimwire.test' && /reject/i.test(m.subject) && m.text.includes(REJECT_REASON), 'rejection mail with the reason');
      expect(rejected.subject).toMatch(/Proposal rejected/i);
      await page.goto('/team?section=outbox');
      await page.getByTestId('outbox-list').waitFor();
      await page.locator('[data-testid^="outbox-message-"]', { hasText: DESIGN_NAME }).first().click();
      await page.getByTestId('outbox-message-text').waitFor();
      await screenshot(page, 'outbox-review', 'admin', 'wide');
    } finally {
      await context.close();
    }
  });

  it('designer: applies the accepted proposal and the new revision’s SPICE-style deck loads in ngspice', async () => {
    const { page, context } = await e2e.newPage('wide');
    try {
      await signIn(page, 'designer@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('bench-screen').waitFor();
      await page.goto(designUrl);
      await page.getByTestId('apply-submit').waitFor();
      await screenshot(page, 'apply', 'designer', 'wide');
      await page.getByTestId('apply-submit').click();
      await expect(page.getByTestId('apply-result').innerText()).resolves.toMatch(/Revision 2 made with 1 accepted proposal/);
      const detail = (await (await page.request.get(`/api/designs/${designId}`)).json()) as { revisions: { number: number; partCounts: { total: number } }[] };
      const [r1, r2] = [detail.revisions.find((r) => r.number === 1)!, detail.revisions.find((r) => r.number === 2)!];
      // The new revision is the old one less what the applied proposal saves.
      const applied = (await (await page.request.get(`/api/designs/${designId}/proposals?status=applied`)).json()) as { proposals: { savings: { parts: number } }[] };
      expect(applied.proposals).toHaveLength(1);
      expect(r1.partCounts.total - r2.partCounts.total).toBe(applied.proposals[0].savings.parts);

      await page.getByTestId('design-open-revisions').click();
      await page.getByTestId('revisions-screen').waitFor();
      await expect(page.getByTestId('design-exports').innerText()).resolves.toContain('Exports of revision 2');
      await page.getByTestId('export-cautions').waitFor();
      await screenshot(page, 'revisions', 'designer', 'wide');
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-spice').click()]);
      const deck = path.join(tmp, download.suggestedFilename() || 'revision-2.cir');
      await download.saveAs(deck);
      const text = fs.readFileSync(deck, 'utf8');
      expect(text).toMatch(/^\.end\s*$/im);

      // ngspice: batch mode reads the whole deck and solves its operating point; a card it cannot
      // read, an unknown model or subcircuit, or a singular circuit is an error (ngspice -b).
      const checked = path.join(tmp, 'revision-2-op.cir');
      fs.writeFileSync(checked, text.replace(/^\.end\s*$/im, '.op\n.end'));
      const run = spawnSync('ngspice', ['-b', checked], { encoding: 'utf8', timeout: 30_000 });
      const log = `${run.stdout}\n${run.stderr}`;
      expect(run.status, log).toBe(0);
      expect(log).not.toMatch(/^\s*error/im);
      expect(log).not.toMatch(/unknown (device|model|subckt)|could not find|singular matrix|no simulations run/i);
      expect(log).toMatch(/Circuit:/);
    } finally {
      await context.close();
    }
  });

  it('every workflow screen at the other size: designer on a phone, reviewer wide', async () => {
    const phone = await e2e.newPage('phone');
    try {
      const page = phone.page;
      await signIn(page, 'designer@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('design-list').waitFor();
      await screenshot(page, 'bench', 'designer', 'phone');
      await page.locator('[data-testid^="design-row-"]', { hasText: DESIGN_NAME }).click();
      await page.getByTestId('design-overview').waitFor();
      await screenshot(page, 'design', 'designer', 'phone');
      await page.goto(`${designUrl}/proposals`);
      await page.getByTestId('proposals-list').waitFor();
      await screenshot(page, 'proposals', 'designer', 'phone');
      await page.locator('[data-testid^="proposal-row-"][role="button"]').first().click();
      await page.getByTestId('proposal-detail').waitFor();
      await screenshot(page, 'proposal', 'designer', 'phone');
      await page.goto(`${designUrl}/revisions`);
      await page.getByTestId('design-exports').waitFor();
      await screenshot(page, 'revisions', 'designer', 'phone');
      await page.goto('/designs/new');
      await page.getByTestId('upload-screen').waitFor();
      await screenshot(page, 'upload', 'designer', 'phone');
    } finally {
      await phone.context.close();
    }
    const wide = await e2e.newPage('wide' as SizeName);
    try {
      const page = wide.page;
      await signIn(page, 'reviewer@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('bench-screen').waitFor();
      await page.getByTestId('tab-sign-off').click();
      await page.getByTestId('sign-off-screen').waitFor();
      const first = page.locator('[data-testid^="proposal-row-"][role="button"]').first();
      if (await first.count()) {
        await first.click();
        await page.getByTestId('proposal-detail').waitFor();
      }
      await screenshot(page, 'sign-off', 'reviewer', 'wide');
      // The decided proposals of the uploaded design, beside the list, with their decisions.
      await page.goto(`${designUrl}/proposals?status=rejected`);
      await page.locator('[data-testid^="proposal-row-"][role="button"]').first().click();
      await page.getByTestId('proposal-decision-0').waitFor();
      await expect(page.getByTestId('proposal-decision-0').innerText()).resolves.toContain(REJECT_REASON);
      await screenshot(page, 'proposals', 'reviewer', 'wide');
    } finally {
      await wide.context.close();
    }
  });
});
