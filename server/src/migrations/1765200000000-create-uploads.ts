import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: outside documents on a case and technique clips with time-stamped notes. The files live in
 * object storage under server-made keys; these rows hold what was checked about them (type from the
 * bytes, size, SHA-256). Organizations gain the setting that lets guardians watch clips, and a
 * version so two admins editing settings cannot overwrite each other.
 */
export class CreateUploads1765200000000 implements MigrationInterface {
  name = 'CreateUploads1765200000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE organizations ADD COLUMN guardians_see_clips boolean NOT NULL DEFAULT false`);
    await q.query(`ALTER TABLE organizations ADD COLUMN version int NOT NULL DEFAULT 1`);
    await q.query(`
      CREATE TABLE case_documents (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        case_id uuid NOT NULL REFERENCES cases(id) ON DELETE RESTRICT,
        title varchar(200) NOT NULL,
        document_date date NOT NULL,
        issued_by varchar(200) NOT NULL,
        media_type varchar(100) NOT NULL,
        size_bytes bigint NOT NULL CHECK (size_bytes >= 0),
        sha256 char(64) NOT NULL,
        storage_key varchar(300) NOT NULL,
        uploaded_by_user_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
        uploaded_by_name varchar(200) NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX case_documents_storage_key ON case_documents (storage_key)`);
    await q.query(`CREATE INDEX case_documents_case_idx ON case_documents (case_id, document_date)`);
    await q.query(`CREATE INDEX case_documents_athlete_idx ON case_documents (organization_id, athlete_id)`);
    await q.query(`
      CREATE TABLE clips (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        training_log_id uuid NOT NULL REFERENCES training_logs(id) ON DELETE RESTRICT,
        exercise varchar(200) NOT NULL,
        caption varchar(500),
        media_type varchar(100) NOT NULL,
        size_bytes bigint NOT NULL CHECK (size_bytes >= 0),
        sha256 char(64) NOT NULL,
        storage_key varchar(300) NOT NULL,
        uploaded_by_user_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
        uploaded_by_name varchar(200) NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX clips_storage_key ON clips (storage_key)`);
    await q.query(`CREATE INDEX clips_athlete_idx ON clips (organization_id, athlete_id, created_at)`);
    await q.query(`CREATE INDEX clips_log_idx ON clips (training_log_id)`);
    await q.query(`
      CREATE TABLE clip_notes (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        clip_id uuid NOT NULL REFERENCES clips(id) ON DELETE CASCADE,
        at_ms int NOT NULL CHECK (at_ms >= 0),
        body text NOT NULL,
        author_user_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
        author_name varchar(200) NOT NULL,
        author_role varchar(20) NOT NULL CHECK (author_role IN ('athlete', 'coach', 'clinician')),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX clip_notes_clip_idx ON clip_notes (clip_id, at_ms)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE clip_notes`);
    await q.query(`DROP TABLE clips`);
    await q.query(`DROP TABLE case_documents`);
    await q.query(`ALTER TABLE organizations DROP COLUMN version`);
    await q.query(`ALTER TABLE organizations DROP COLUMN guardians_see_clips`);
  }
}
