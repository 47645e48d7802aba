// Lessons an educator builds from a design revision and a chosen set of its proposals, their share
// links, the trade-off explorer's data and the what-if request. Notes are Markdown kept as text;
// the client renders it without raw HTML.
import { z } from 'zod';

export const LESSON_STATUSES = ['draft', 'published'] as const;
export const LessonStatusSchema = z.enum(LESSON_STATUSES);

export const SectionBodySchema = z.strictObject({
  /** Kept when a section is edited or moved; new sections get one from the server. */
  id: z.uuid().optional(),
  heading: z.string().trim().min(1).max(200),
  /** Markdown; raw HTML in it is shown as text, never rendered. */
  body: z.string().max(20_000),
});
export const SectionSchema = z.object({ id: z.uuid(), heading: z.string(), body: z.string() });
export type Section = z.infer<typeof SectionSchema>;

export const LessonSummarySchema = z.object({
  id: z.uuid(),
  title: z.string(),
  status: LessonStatusSchema,
  designName: z.string(),
  revision: z.number().int(),
  proposalCount: z.number().int(),
  author: z.string(),
  updatedAt: z.string(),
  publishedAt: z.string().nullable(),
});
export type LessonSummary = z.infer<typeof LessonSummarySchema>;

export const LessonSchema = LessonSummarySchema.extend({
  designId: z.uuid(),
  authorId: z.uuid().nullable(),
  proposalIds: z.array(z.uuid()),
  sections: z.array(SectionSchema),
  createdAt: z.string(),
});
export type Lesson = z.infer<typeof LessonSchema>;

export const LessonListResponseSchema = z.object({ lessons: z.array(LessonSummarySchema) });

export const LessonBodySchema = z.strictObject({
  title: z.string().trim().min(1).max(200),
  designId: z.uuid(),
  /** Revision number; the latest when left out. */
  revision: z.number().int().min(1).optional(),
  proposalIds: z.array(z.uuid()).max(200).default([]),
  sections: z.array(SectionBodySchema).max(100).default([]),
});
export type LessonBody = z.infer<typeof LessonBodySchema>;

/** Sections are sent whole: their order is the new order (that is how a reorder is saved). */
export const LessonPatchBodySchema = z.strictObject({
  title: z.string().trim().min(1).max(200).optional(),
  proposalIds: z.array(z.uuid()).max(200).optional(),
  sections: z.array(SectionBodySchema).max(100).optional(),
  /** Back to draft (unpublish); publishing has its own route. */
  status: z.literal('draft').optional(),
});
export type LessonPatchBody = z.infer<typeof LessonPatchBodySchema>;

export const LessonParamsSchema = z.strictObject({ id: z.uuid() });
export const ShareLinkParamsSchema = z.strictObject({ id: z.uuid(), linkId: z.uuid() });
/** 32 random bytes in base64url are 43 characters. */
export const ShareTokenParamsSchema = z.strictObject({ token: z.string().regex(/^[A-Za-z0-9_-]{43}$/) });

export const ShareLinkBodySchema = z.strictObject({
  /** ISO time after which the link stops working; never when left out. */
  expiresAt: z.iso.datetime({ offset: true }).optional(),
  /** true: anyone with the link; false: signed-in members of the team only. */
  public: z.boolean(),
});
export type ShareLinkBody = z.infer<typeof ShareLinkBodySchema>;

export const ShareLinkSchema = z.object({
  id: z.uuid(),
  public: z.boolean(),
  expiresAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
  createdAt: z.string(),
  createdBy: z.string(),
});
export type ShareLink = z.infer<typeof ShareLinkSchema>;
/** The token is shown once, at creation; only its hash is stored. */
export const ShareLinkCreatedSchema = ShareLinkSchema.extend({ token: z.string(), url: z.string() });
export const ShareLinkListResponseSchema = z.object({ links: z.array(ShareLinkSchema) });

export const WhatIfSettingsSchema = z.strictObject({
  betaMin: z.number().positive().max(10_000).optional(),
  pullUpOhms: z.number().positive().max(1e9).optional(),
  supplyVolts: z.number().positive().max(1_000).optional(),
  clockPeriod: z.number().positive().max(1e3).optional(),
  loads: z.number().int().positive().max(10_000).optional(),
});
export type WhatIfSettingsBody = z.infer<typeof WhatIfSettingsSchema>;

export const WhatIfBodySchema = z.strictObject({
  settings: WhatIfSettingsSchema.default({}),
  /** Proposal ids toggled on; every one must be in the explorer. */
  enabled: z.array(z.uuid()).max(200),
});
export type WhatIfBody = z.infer<typeof WhatIfBodySchema>;
