// The role matrix's rows for lessons, share links, the explorer and what-if (role-matrix.test.ts
// spreads them into its table). Fresh lessons and links per call, authored by the demo educator.
import type { Harness } from './support/harness';
import { roleEmail } from './support/harness';
import { newShareToken } from '@/server/features/share/service';
import { ROLES, type Role } from '@/shared/domain/roles';
import { seedLessonDesign, type LessonDesign } from './lessons-fixture';

type Caller = Role | 'signed-out';
type Call = { method: 'get' | 'post' | 'patch' | 'delete'; path: string; body?: unknown };
export type LessonRow = { route: string; call: (h: Harness) => Promise<Call> | Call; expect: Record<Caller, number> };

const all = (status: number): Record<Caller, number> =>
  Object.fromEntries([...ROLES, 'signed-out'].map((c) => [c, status])) as Record<Caller, number>;
const members = (status: number) => ({ ...all(status), 'signed-out': 401 });
/** Educators and admins; everyone else in the team 403. */
const writers = (status: number) => ({ ...all(403), educator: status, admin: status, 'signed-out': 401 });

let fixture: Promise<LessonDesign & { educatorId: string }> | undefined;
function lessonDesign(h: Harness) {
  return (fixture ??= (async () => {
    const educator = (await h.db.models.User.findOne({ where: { email: roleEmail('educator') } }))!;
    return { ...(await seedLessonDesign(h.db, h.demoTeamId, 'Matrix lesson design')), educatorId: educator.id };
  })());
}

async function freshLesson(h: Harness, status: 'draft' | 'published' = 'published'): Promise<string> {
  const f = await lessonDesign(h);
  const l = await h.db.models.Lesson.create({
    teamId: h.demoTeamId, designId: f.designId, revisionId: f.revisionId, authorId: f.educatorId, title: 'Matrix lesson',
    proposalIds: f.proposalIds, sections: [], status, publishedAt: status === 'published' ? new Date() : null,
  });
  return l.id;
}

async function freshLink(h: Harness): Promise<{ lessonId: string; linkId: string; token: string }> {
  const lessonId = await freshLesson(h);
  const { token, hash } = newShareToken();
  const link = await h.db.models.LessonShareLink.create({ lessonId, tokenHash: hash, public: true, expiresAt: null, createdBy: null });
  return { lessonId, linkId: link.id, token };
}

const l = async (h: Harness, rest = '', status: 'draft' | 'published' = 'published') => `/api/lessons/${await freshLesson(h, status)}${rest}`;

export const LESSON_ROWS: LessonRow[] = [
  { route: 'GET /api/lessons', call: () => ({ method: 'get', path: '/api/lessons' }), expect: members(200) },
  {
    route: 'POST /api/lessons',
    call: async (h) => ({ method: 'post', path: '/api/lessons', body: { title: 'Matrix', designId: (await lessonDesign(h)).designId } }),
    expect: writers(201),
  },
  { route: 'GET /api/lessons/:id (published)', call: async (h) => ({ method: 'get', path: await l(h) }), expect: members(200) },
  {
    route: 'GET /api/lessons/:id (someone else’s draft)',
    call: async (h) => ({ method: 'get', path: await l(h, '', 'draft') }),
    expect: { ...members(404), educator: 200, admin: 200 },
  },
  { route: 'PATCH /api/lessons/:id', call: async (h) => ({ method: 'patch', path: await l(h), body: { title: 'Renamed' } }), expect: writers(200) },
  { route: 'DELETE /api/lessons/:id', call: async (h) => ({ method: 'delete', path: await l(h) }), expect: writers(204) },
  { route: 'POST /api/lessons/:id/duplicate', call: async (h) => ({ method: 'post', path: await l(h, '/duplicate') }), expect: writers(201) },
  {
    route: 'POST /api/lessons/:id/publish',
    call: async (h) => ({ method: 'post', path: await l(h, '/publish', 'draft') }),
    // The educator's draft is invisible to the rest of the team.
    expect: { ...members(404), educator: 200, admin: 200 },
  },
  { route: 'GET /api/lessons/:id/explorer', call: async (h) => ({ method: 'get', path: await l(h, '/explorer') }), expect: members(200) },
  {
    route: 'POST /api/lessons/:id/whatif',
    call: async (h) => ({ method: 'post', path: await l(h, '/whatif'), body: { settings: { supplyVolts: 4.5 }, enabled: [] } }),
    expect: members(200),
  },
  { route: 'GET /api/lessons/:id/share-links', call: async (h) => ({ method: 'get', path: await l(h, '/share-links') }), expect: writers(200) },
  { route: 'POST /api/lessons/:id/share-links', call: async (h) => ({ method: 'post', path: await l(h, '/share-links'), body: { public: true } }), expect: writers(201) },
  {
    route: 'DELETE /api/lessons/:id/share-links/:linkId',
    call: async (h) => {
      const k = await freshLink(h);
      return { method: 'delete', path: `/api/lessons/${k.lessonId}/share-links/${k.linkId}` };
    },
    expect: writers(204),
  },
  { route: 'GET /api/designs/:id/explorer', call: async (h) => ({ method: 'get', path: `/api/designs/${(await lessonDesign(h)).designId}/explorer` }), expect: members(200) },
  { route: 'GET /api/share/:token (public link)', call: async (h) => ({ method: 'get', path: `/api/share/${(await freshLink(h)).token}` }), expect: all(200) },
  {
    route: 'POST /api/share/:token/whatif',
    call: async (h) => ({ method: 'post', path: `/api/share/${(await freshLink(h)).token}/whatif`, body: { enabled: [] } }),
    expect: all(200),
  },
];
