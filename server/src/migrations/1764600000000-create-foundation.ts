import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: the foundation — organizations, people and their roles, care teams, guardian links,
 * invitations, sessions (connect-pg-simple) and the append-only, hash-chained audit trail.
 */
export class CreateFoundation1764600000000 implements MigrationInterface {
  name = 'CreateFoundation1764600000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE organizations (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        name varchar(200) NOT NULL,
        emergency_number varchar(30) NOT NULL DEFAULT '911',
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE users (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email varchar(254) NOT NULL,
        password_hash varchar(100) NOT NULL,
        display_name varchar(120) NOT NULL,
        unit_pref varchar(2) NOT NULL DEFAULT 'kg' CONSTRAINT users_unit_pref_check CHECK (unit_pref IN ('kg', 'lb')),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE UNIQUE INDEX users_email_key ON users (email)`);
    await q.query(`
      CREATE TABLE memberships (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        roles text[] NOT NULL CONSTRAINT memberships_roles_check CHECK (
          cardinality(roles) > 0 AND roles <@ ARRAY['athlete','coach','clinician','guardian','admin']::text[]),
        active boolean NOT NULL DEFAULT true,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE UNIQUE INDEX memberships_org_user_key ON memberships (organization_id, user_id)`);
    await q.query(`CREATE INDEX memberships_user_idx ON memberships (user_id)`);
    await q.query(`
      CREATE TABLE athlete_profiles (
        membership_id uuid PRIMARY KEY REFERENCES memberships(id) ON DELETE CASCADE,
        organization_id uuid NOT NULL,
        date_of_birth date,
        sport varchar(80),
        position varchar(80),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE INDEX athlete_profiles_org_idx ON athlete_profiles (organization_id)`);
    await q.query(`
      CREATE TABLE care_team_assignments (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        member_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        role varchar(20) NOT NULL CONSTRAINT care_team_assignments_role_check CHECK (role IN ('coach', 'clinician')),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX care_team_assignments_key ON care_team_assignments (athlete_id, member_id, role)`);
    await q.query(`CREATE INDEX care_team_assignments_member_idx ON care_team_assignments (member_id)`);
    await q.query(`
      CREATE TABLE guardian_links (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        guardian_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX guardian_links_key ON guardian_links (athlete_id, guardian_id)`);
    await q.query(`CREATE INDEX guardian_links_guardian_idx ON guardian_links (guardian_id)`);
    await q.query(`
      CREATE TABLE invitations (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        email varchar(254) NOT NULL,
        roles text[] NOT NULL,
        display_name varchar(120),
        date_of_birth date,
        sport varchar(80),
        token_hash char(64) NOT NULL,
        expires_at timestamptz NOT NULL,
        accepted_at timestamptz,
        revoked_at timestamptz,
        invited_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX invitations_token_hash_key ON invitations (token_hash)`);
    await q.query(`CREATE INDEX invitations_org_idx ON invitations (organization_id)`);

    // connect-pg-simple's table, as its own table.sql defines it.
    await q.query(`
      CREATE TABLE "session" (
        sid varchar NOT NULL COLLATE "default" PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      )`);
    await q.query(`CREATE INDEX "IDX_session_expire" ON "session" (expire)`);

    await q.query(`
      CREATE TABLE audit_entries (
        id bigserial PRIMARY KEY,
        organization_id uuid,
        occurred_at timestamptz NOT NULL,
        actor_user_id uuid,
        action varchar(80) NOT NULL,
        subject_type varchar(60) NOT NULL,
        subject_id varchar(64),
        before jsonb,
        after jsonb,
        request_id varchar(64),
        prev_hash char(64) NOT NULL,
        hash char(64) NOT NULL
      )`);
    await q.query(`CREATE INDEX audit_entries_org_id_idx ON audit_entries (organization_id, id)`);
    // Append-only, enforced by the database so no code path (or person with the app's credentials)
    // can quietly edit history.
    await q.query(`
      CREATE FUNCTION audit_entries_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'audit_entries is append-only: % refused', TG_OP USING ERRCODE = 'insufficient_privilege';
      END $$`);
    await q.query(`
      CREATE TRIGGER audit_entries_no_update_delete BEFORE UPDATE OR DELETE ON audit_entries
      FOR EACH ROW EXECUTE FUNCTION audit_entries_refuse_change()`);
    await q.query(`
      CREATE TRIGGER audit_entries_no_truncate BEFORE TRUNCATE ON audit_entries
      FOR EACH STATEMENT EXECUTE FUNCTION audit_entries_refuse_change()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE audit_entries`);
    await q.query(`DROP FUNCTION audit_entries_refuse_change()`);
    await q.query(`DROP TABLE "session"`);
    await q.query(`DROP TABLE invitations`);
    await q.query(`DROP TABLE guardian_links`);
    await q.query(`DROP TABLE care_team_assignments`);
    await q.query(`DROP TABLE athlete_profiles`);
    await q.query(`DROP TABLE memberships`);
    await q.query(`DROP TABLE users`);
    await q.query(`DROP TABLE organizations`);
  }
}
