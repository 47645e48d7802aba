// Lessons in Chromium, end to end: the educator builds a lesson from the scanned Wren-8 strobe and
// bus design, writes and reorders its notes, publishes it and creates a public share link; the link
// opens in a fresh, signed-out browser at phone and wide sizes, where a proposal is switched off
// and on and a slider is moved until a margin's badge turns from Pass to Fail. The stored design's
// proposals are unchanged afterwards. Screens are photographed at both sizes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { runWhatIf, type ExplorerData, type SettingKey, type WhatIfSettings } from '@/optimizer/whatif';
import { DEMO_TEAM_NAME } from '@/server/db/seed';
import { seedLessonDesign } from '../integration/lessons-fixture';
import { DEMO_PASSWORD, screenshot, signIn, startE2e, type E2e, type SizeName } from './harness';

const DESIGN_NAME = `Wren-8 strobe and bus, lesson copy ${Date.now().toString(36)}`;
const LESSON_TITLE = 'What a shared bus line costs';
// Markup in notes must show as text, never run.
const NOTE = 'The **bus** saves parts.\n\n- watch the *rise time*\n- <img src=x onerror="window.__pwned=1">';

let e2e: E2e;
let shareUrl = '';
let designId = '';

beforeAll(async () => {
  e2e = await startE2e();
  const team = await e2e.server.db.models.Team.findOne({ where: { name: DEMO_TEAM_NAME }, order: [['createdAt', 'ASC']] });
  if (!team) throw new Error('the demo team is missing');
  designId = (await seedLessonDesign(e2e.server.db, team.id, DESIGN_NAME)).designId;
});

afterAll(async () => {
  await e2e?.stop();
});

const SLIDERS: SettingKey[] = ['pullUpOhms', 'betaMin', 'supplyVolts', 'clockPeriod', 'loads'];

/**
 * With the engine the browser runs, finds a slider and a direction that turn some margin from
 * pass (at the scanned figures) to fail, and the badge's place (proposal and margin index).
 */
function findPassToFail(explorer: ExplorerData) {
  const enabled = explorer.proposals.map((p) => p.id);
  const start = runWhatIf(explorer.inputs, {}, enabled);
  for (const key of SLIDERS) {
    const range = explorer.defaults.ranges[key];
    for (const [end, keyName] of [[range.max, 'PageUp'], [range.min, 'PageDown']] as const) {
      const moved: WhatIfSettings = { [key]: end };
      const after = runWhatIf(explorer.inputs, moved, enabled);
      for (let pi = 0; pi < start.proposals.length; pi++) {
        const mi = start.proposals[pi]!.margins.findIndex((m, i) => m.status === 'pass' && after.proposals[pi]!.margins[i]?.status === 'fail');
        if (mi >= 0) return { key, keyName, pi, mi };
      }
    }
  }
  throw new Error('no slider turns a margin of this lesson from pass to fail');
}

async function exploreShared(page: Page, size: SizeName) {
  await page.goto(shareUrl);
  await page.getByTestId('explorer').waitFor();
  expect(await page.getByTestId('share-readonly').innerText()).toContain('read-only');
  // The notes' markup is text on the page, not an element.
  expect(await page.getByTestId('lesson-sections').innerText()).toContain('<img src=x');
  expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
  await screenshot(page, 'share', 'anonymous', size);

  const token = shareUrl.split('/').pop()!;
  const explorer = ((await (await page.request.get(`/api/share/${token}`)).json()) as { explorer: ExplorerData }).explorer;
  expect(explorer.proposals.length).toBeGreaterThan(1);

  // Switching a proposal off takes its parts saving away from the "after" column.
  const afterCell = page.getByTestId('explorer-parts-table-row-0');
  const withAll = await afterCell.innerText();
  await page.getByTestId('explorer-toggle-0').click();
  await expect.poll(() => page.getByTestId('explorer-proposal-margins-0').innerText()).toContain('off');
  await expect.poll(() => afterCell.innerText()).not.toBe(withAll);
  await page.getByTestId('explorer-toggle-0').click();
  await expect.poll(() => afterCell.innerText()).toBe(withAll);

  const { key, keyName, pi, mi } = findPassToFail(explorer);
  const badge = page.getByTestId(`margin-badge-${pi}-${mi}`);
  expect(await badge.innerText()).toBe('Pass');
  const slider = page.getByTestId(`explorer-slider-${key}`);
  await slider.scrollIntoViewIfNeeded();
  await slider.focus();
  const first = await page.getByTestId(`explorer-slider-${key}-value`).innerText();
  // A tenth of the range a press; ten presses reach the end of the track.
  for (let i = 0; i < 10 && (await badge.innerText()) !== 'Fail'; i++) await page.keyboard.press(keyName);
  expect(await badge.innerText()).toBe('Fail');
  expect(await page.getByTestId(`explorer-slider-${key}-value`).innerText()).not.toBe(first);
  expect(await slider.getAttribute('role')).toBe('slider');
  await badge.scrollIntoViewIfNeeded();
  await screenshot(page, 'share-explored', 'anonymous', size);

  // The two-level rewrite's side by side: map with don't-cares and the cover.
  const side = page.getByTestId('explorer-two-level-0');
  await side.scrollIntoViewIfNeeded();
  expect(await page.getByTestId('explorer-two-level-0-cover').innerText()).toMatch(/=/);
  expect(await page.getByTestId('explorer-two-level-0-map').innerText()).toContain('–');
  await screenshot(page, 'share-two-level', 'anonymous', size);

  // Back to the scanned figures: the badge passes again.
  await page.getByTestId('explorer-reset').click();
  await expect.poll(() => badge.innerText()).toBe('Pass');
}

describe('lessons end to end', () => {
  it('the educator builds, publishes and shares a lesson from a scanned demo design', async () => {
    const { context, page } = await e2e.newPage('wide');
    try {
      await signIn(page, 'educator@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('tab-lessons').first().waitFor();
      await page.goto('/lessons');
      await page.getByTestId('lesson-new').click();
      await page.getByTestId('lesson-create-title').fill(LESSON_TITLE);
      await page.getByTestId('lesson-create').getByText(DESIGN_NAME, { exact: false }).click();
      await expect.poll(() => page.getByTestId('lesson-create-count').innerText()).toMatch(/^[1-9]\d* proposal/);
      await page.getByTestId('lesson-create-submit').click();
      await page.getByTestId('lesson-editor').waitFor();
      expect(await page.getByTestId('lesson-status').innerText()).toBe('Draft');

      // Notes in two sections, then the new one moved to the top.
      await page.getByTestId('section-body-0').fill(NOTE);
      await page.getByTestId('section-add').click();
      await page.getByTestId('section-heading-1').fill('Before you start');
      await page.getByTestId('section-body-1').fill('Open the **explorer** below.');
      await page.getByTestId('section-up-1').click();
      expect(await page.getByTestId('section-heading-0').inputValue()).toBe('Before you start');
      await page.getByTestId('lesson-save').click();
      await expect.poll(() => page.getByTestId('lesson-message').innerText()).toBe('Saved.');

      await page.getByTestId('lesson-publish').click();
      await expect.poll(() => page.getByTestId('lesson-status').innerText()).toBe('Published');
      await page.getByTestId('share-create').click();
      shareUrl = await page.getByTestId('share-url').innerText();
      expect(shareUrl).toMatch(/\/share\/[A-Za-z0-9_-]{43}$/);
      await page.getByTestId('share-link-0').waitFor();
      await screenshot(page, 'lessons', 'educator', 'wide');

      // The saved order is the server's order.
      const lessonId = new URL(page.url()).searchParams.get('lesson');
      const saved = (await (await page.request.get(`/api/lessons/${lessonId}`)).json()) as { sections: { heading: string }[] };
      expect(saved.sections.map((s) => s.heading)).toEqual(['Before you start', 'What to look for']);

      await page.getByTestId('lesson-handout').click();
      await page.getByTestId('handout-screen').getByText('Before you start').waitFor();
      await screenshot(page, 'handout', 'educator', 'wide');
    } finally {
      await context.close();
    }
  });

  it('shows the lesson list and editor on a phone', async () => {
    const { context, page } = await e2e.newPage('phone');
    try {
      await signIn(page, 'educator@trimwire.test', DEMO_PASSWORD);
      await page.getByTestId('tab-lessons').first().waitFor();
      await page.goto('/lessons');
      await page.getByTestId('lessons-published').getByText(LESSON_TITLE).first().waitFor();
      await screenshot(page, 'lessons-list', 'educator', 'phone');
    } finally {
      await context.close();
    }
  });

  for (const size of ['phone', 'wide'] as const) {
    it(`opens the public link signed out (${size}); a slider turns a margin from Pass to Fail`, async () => {
      expect(shareUrl).not.toBe('');
      const { context, page } = await e2e.newPage(size);
      try {
        expect(await context.cookies()).toEqual([]);
        const before = await e2e.server.db.models.Proposal.findAll({ where: { designId }, attributes: ['id', 'margins', 'status'], order: [['id', 'ASC']] });
        await exploreShared(page, size);
        // A what-if never changes the stored design.
        const after = await e2e.server.db.models.Proposal.findAll({ where: { designId }, attributes: ['id', 'margins', 'status'], order: [['id', 'ASC']] });
        expect(after.map((p) => p.toJSON())).toEqual(before.map((p) => p.toJSON()));
      } finally {
        await context.close();
      }
    });
  }
});
