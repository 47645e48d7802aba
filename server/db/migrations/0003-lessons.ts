// Lessons (a design revision, chosen proposals, Markdown notes in sections; draft or published) and
// their share links (only a sha256 of the token is stored; revocable; optional expiry).
import type { Migration } from '@/server/db/migrations/types';

export const lessons: Migration = {
  name: '0003-lessons',
  async up({ context: qi }) {
    await qi.sequelize.query(`
      CREATE TABLE lessons (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        team_id uuid NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
        design_id uuid NOT NULL REFERENCES designs(id) ON DELETE CASCADE,
        revision_id uuid NOT NULL REFERENCES revisions(id) ON DELETE CASCADE,
        author_id uuid REFERENCES users(id) ON DELETE SET NULL,
        title text NOT NULL,
        status text NOT NULL DEFAULT 'draft' CHECK (status IN ('draft', 'published')),
        proposal_ids uuid[] NOT NULL DEFAULT '{}',
        sections jsonb NOT NULL DEFAULT '[]'::jsonb,
        published_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX lessons_team_idx ON lessons(team_id, updated_at DESC);
      CREATE TABLE lesson_share_links (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lesson_id uuid NOT NULL REFERENCES lessons(id) ON DELETE CASCADE,
        token_hash text NOT NULL UNIQUE,
        public boolean NOT NULL,
        expires_at timestamptz,
        revoked_at timestamptz,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX lesson_share_links_lesson_idx ON lesson_share_links(lesson_id);
    `);
  },
  async down({ context: qi }) {
    await qi.sequelize.query(`DROP TABLE IF EXISTS lesson_share_links, lessons CASCADE;`);
  },
};
