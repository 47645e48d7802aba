// Review workflow schema: designs, immutable revisions, boards with budgets, assumptions, scans
// (job state, progress, heartbeat), proposals, decisions and comments, with indexes for the filters.
import type { Migration } from '@/server/db/migrations/types';

export const workflow: Migration = {
  name: '0002-workflow',
  async up({ context: qi }) {
    await qi.sequelize.query(`
      CREATE TABLE designs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        team_id uuid NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
        name text NOT NULL,
        family text NOT NULL CHECK (family IN ('rtl', 'dtl', 'cmos', 'nmos', 'gate')),
        clock_period_ns double precision,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX designs_team_idx ON designs(team_id, updated_at DESC);
      CREATE TABLE revisions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        design_id uuid NOT NULL REFERENCES designs(id) ON DELETE CASCADE,
        number integer NOT NULL CHECK (number >= 1),
        format text NOT NULL,
        file_name text NOT NULL,
        source text NOT NULL,
        sha256 text NOT NULL,
        summary jsonb NOT NULL,
        part_counts jsonb NOT NULL,
        note text,
        applied_proposals uuid[] NOT NULL DEFAULT '{}',
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (design_id, number)
      );
      -- Revisions are immutable: no UPDATE ever reaches a stored revision.
      CREATE FUNCTION revisions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN RAISE EXCEPTION 'revisions are immutable'; END $$;
      CREATE TRIGGER revisions_no_update BEFORE UPDATE ON revisions FOR EACH ROW EXECUTE FUNCTION revisions_immutable();
      CREATE TABLE boards (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        design_id uuid NOT NULL REFERENCES designs(id) ON DELETE CASCADE,
        name text NOT NULL,
        instances text[] NOT NULL DEFAULT '{}',
        budget jsonb NOT NULL DEFAULT '{}'::jsonb,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX boards_design_idx ON boards(design_id);
      CREATE TABLE assumptions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        design_id uuid NOT NULL REFERENCES designs(id) ON DELETE CASCADE,
        expression text NOT NULL,
        justification text NOT NULL,
        owner_id uuid REFERENCES users(id) ON DELETE SET NULL,
        status text NOT NULL DEFAULT 'active' CHECK (status IN ('active', 'withdrawn')),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX assumptions_design_idx ON assumptions(design_id);
      CREATE TABLE scans (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        design_id uuid NOT NULL REFERENCES designs(id) ON DELETE CASCADE,
        revision_id uuid NOT NULL REFERENCES revisions(id) ON DELETE CASCADE,
        revision_number integer NOT NULL,
        status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued', 'running', 'done', 'failed', 'cancelled')),
        progress real NOT NULL DEFAULT 0,
        stage text NOT NULL DEFAULT 'queued',
        rules text[],
        started_by uuid REFERENCES users(id) ON DELETE SET NULL,
        cancel_requested boolean NOT NULL DEFAULT false,
        attempts integer NOT NULL DEFAULT 0,
        worker text,
        heartbeat_at timestamptz,
        job_id text,
        started_at timestamptz,
        finished_at timestamptz,
        timings jsonb NOT NULL DEFAULT '{}'::jsonb,
        engine_version text NOT NULL,
        error text,
        rule_errors jsonb NOT NULL DEFAULT '[]'::jsonb,
        proposal_count integer NOT NULL DEFAULT 0,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX scans_design_idx ON scans(design_id, created_at DESC);
      CREATE INDEX scans_running_idx ON scans(heartbeat_at) WHERE status = 'running';
      CREATE TABLE proposals (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        scan_id uuid NOT NULL REFERENCES scans(id) ON DELETE CASCADE,
        design_id uuid NOT NULL REFERENCES designs(id) ON DELETE CASCADE,
        revision_id uuid NOT NULL REFERENCES revisions(id) ON DELETE CASCADE,
        revision_number integer NOT NULL,
        engine_id text NOT NULL,
        rule_id text NOT NULL,
        title text NOT NULL,
        message text NOT NULL,
        location jsonb NOT NULL,
        edit jsonb NOT NULL,
        savings jsonb NOT NULL,
        savings_parts integer NOT NULL,
        verification jsonb NOT NULL,
        margins jsonb NOT NULL,
        assumption_ids uuid[] NOT NULL DEFAULT '{}',
        verdict text NOT NULL CHECK (verdict IN ('proved', 'refuted', 'unverified')),
        margin_status text NOT NULL CHECK (margin_status IN ('pass', 'warn', 'fail')),
        readiness text NOT NULL,
        status text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'accepted', 'rejected', 'out-of-date', 'applied')),
        overlaps_with uuid[] NOT NULL DEFAULT '{}',
        board_ids uuid[] NOT NULL DEFAULT '{}',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (scan_id, engine_id)
      );
      CREATE INDEX proposals_design_status_idx ON proposals(design_id, status);
      CREATE INDEX proposals_design_rule_idx ON proposals(design_id, rule_id);
      CREATE INDEX proposals_scan_idx ON proposals(scan_id);
      CREATE INDEX proposals_open_idx ON proposals(created_at DESC) WHERE status = 'open';
      CREATE INDEX proposals_boards_idx ON proposals USING gin (board_ids);
      CREATE INDEX proposals_assumptions_idx ON proposals USING gin (assumption_ids);
      CREATE TABLE decisions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        proposal_id uuid NOT NULL REFERENCES proposals(id) ON DELETE CASCADE,
        reviewer_id uuid REFERENCES users(id) ON DELETE SET NULL,
        reviewer_email text NOT NULL,
        decision text NOT NULL CHECK (decision IN ('accept', 'reject')),
        reason text,
        created_at timestamptz NOT NULL DEFAULT now(),
        CHECK (decision <> 'reject' OR reason IS NOT NULL)
      );
      CREATE INDEX decisions_proposal_idx ON decisions(proposal_id);
      CREATE TABLE comments (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        proposal_id uuid NOT NULL REFERENCES proposals(id) ON DELETE CASCADE,
        author_id uuid REFERENCES users(id) ON DELETE SET NULL,
        author_email text NOT NULL,
        body text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX comments_proposal_idx ON comments(proposal_id, created_at);
    `);
  },
  async down({ context: qi }) {
    await qi.sequelize.query(`
      DROP TABLE IF EXISTS comments, decisions, proposals, scans, assumptions, boards, revisions, designs CASCADE;
      DROP FUNCTION IF EXISTS revisions_immutable();
    `);
  },
};
