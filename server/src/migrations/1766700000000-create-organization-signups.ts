import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: organizations start themselves, from a public page. An organization records its country, and a public
 * sign-up waits in `organization_signups` until its first admin confirms the e-mail address: the
 * organization is created only then. Old organizations keep no country (null).
 */
export class CreateOrganizationSignups1766700000000 implements MigrationInterface {
  name = 'CreateOrganizationSignups1766700000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE organizations ADD COLUMN country varchar(2)`);
    await q.query(`
      CREATE TABLE organization_signups (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_name varchar(200) NOT NULL,
        country varchar(2) NOT NULL,
        time_zone varchar(64) NOT NULL,
        admin_name varchar(120) NOT NULL,
        email varchar(254) NOT NULL,
        password_hash varchar(100),
        token_hash char(64) NOT NULL,
        expires_at timestamptz NOT NULL,
        confirmed_at timestamptz,
        organization_id uuid REFERENCES organizations(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX organization_signups_token_hash_key ON organization_signups (token_hash)`);
    await q.query(`CREATE INDEX organization_signups_email_idx ON organization_signups (email)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE organization_signups`);
    await q.query(`ALTER TABLE organizations DROP COLUMN country`);
  }
}
