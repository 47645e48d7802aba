// First schema: people, teams, memberships, e-mailed tokens, sessions (connect-pg-simple's table),
// the audit log, captured mail and notification preferences.
import type { Migration } from '@/server/db/migrations/types';

export const foundation: Migration = {
  name: '0001-foundation',
  async up({ context: qi }) {
    await qi.sequelize.query(`
      CREATE TABLE users (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email text NOT NULL UNIQUE CHECK (email = lower(email)),
        name text NOT NULL,
        password_hash text,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE TABLE teams (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        name text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE TABLE memberships (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        team_id uuid NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        role text NOT NULL CHECK (role IN ('admin', 'designer', 'reviewer', 'educator', 'viewer')),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (team_id, user_id)
      );
      CREATE INDEX memberships_user_idx ON memberships(user_id);
      CREATE TABLE tokens (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        kind text NOT NULL CHECK (kind IN ('invite', 'reset')),
        token_hash text NOT NULL UNIQUE,
        email text NOT NULL,
        user_id uuid REFERENCES users(id) ON DELETE CASCADE,
        team_id uuid REFERENCES teams(id) ON DELETE CASCADE,
        role text CHECK (role IS NULL OR role IN ('admin', 'designer', 'reviewer', 'educator', 'viewer')),
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK (kind <> 'invite' OR (team_id IS NOT NULL AND role IS NOT NULL)),
        CHECK (kind <> 'reset' OR user_id IS NOT NULL)
      );
      CREATE INDEX tokens_team_idx ON tokens(team_id) WHERE used_at IS NULL;
      CREATE TABLE session (
        sid varchar NOT NULL PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      );
      CREATE INDEX session_expire_idx ON session(expire);
      CREATE TABLE audit_log (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        team_id uuid REFERENCES teams(id) ON DELETE CASCADE,
        actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
        actor_email text,
        action text NOT NULL,
        target text,
        details jsonb NOT NULL DEFAULT '{}'::jsonb,
        at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX audit_log_team_at_idx ON audit_log(team_id, at DESC);
      CREATE TABLE mail_outbox (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        team_ids uuid[] NOT NULL DEFAULT '{}',
        to_address text NOT NULL,
        from_address text NOT NULL,
        subject text NOT NULL,
        text text NOT NULL,
        html text,
        received_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX mail_outbox_team_ids_idx ON mail_outbox USING gin (team_ids);
      CREATE TABLE notification_prefs (
        user_id uuid PRIMARY KEY REFERENCES users(id) ON DELETE CASCADE,
        review_requests boolean NOT NULL DEFAULT true,
        decisions boolean NOT NULL DEFAULT true,
        updated_at timestamptz NOT NULL DEFAULT now()
      );
    `);
  },
  async down({ context: qi }) {
    await qi.sequelize.query(`
      DROP TABLE IF EXISTS notification_prefs, mail_outbox, audit_log, session, tokens, memberships, teams, users;
    `);
  },
};
