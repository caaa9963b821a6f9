import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: clearance letters (signed, frozen PDFs with a public verification code), guardian
 * acknowledgements, one delivery row per e-mail so a retry never sends twice, and the local fake
 * mail server's mailbox for the outbox page.
 */
export class CreateLettersAndMail1765100000000 implements MigrationInterface {
  name = 'CreateLettersAndMail1765100000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE clearance_letters (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        decision varchar(10) NOT NULL CHECK (decision IN ('full', 'limited')),
        effective_from date NOT NULL,
        valid_until date,
        limits jsonb NOT NULL DEFAULT '[]',
        clinician_name varchar(120) NOT NULL,
        credential varchar(80) NOT NULL,
        licence_number varchar(80) NOT NULL,
        family_note text NOT NULL DEFAULT '',
        signature varchar(120),
        signed_at timestamptz,
        code_hash char(64),
        status varchar(12) NOT NULL DEFAULT 'draft' CHECK (status IN ('draft', 'signed', 'superseded')),
        superseded_by uuid REFERENCES clearance_letters(id) ON DELETE SET NULL,
        pdf bytea,
        pdf_sha256 char(64),
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE UNIQUE INDEX clearance_letters_code_key ON clearance_letters (code_hash) WHERE code_hash IS NOT NULL`);
    await q.query(`CREATE INDEX clearance_letters_athlete_idx ON clearance_letters (organization_id, athlete_id, created_at)`);
    await q.query(`
      CREATE TABLE letter_acknowledgements (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        letter_id uuid NOT NULL REFERENCES clearance_letters(id) ON DELETE CASCADE,
        guardian_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        acknowledged_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX letter_acknowledgements_key ON letter_acknowledgements (letter_id, guardian_id)`);
    await q.query(`
      CREATE TABLE email_deliveries (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid REFERENCES organizations(id) ON DELETE CASCADE,
        kind varchar(40) NOT NULL,
        to_address varchar(254) NOT NULL,
        recipient_id uuid REFERENCES memberships(id) ON DELETE SET NULL,
        subject varchar(200) NOT NULL,
        body_text text,
        body_html text,
        letter_id uuid REFERENCES clearance_letters(id) ON DELETE SET NULL,
        status varchar(10) NOT NULL DEFAULT 'queued' CHECK (status IN ('queued', 'sending', 'sent', 'failed')),
        attempts int NOT NULL DEFAULT 0,
        last_error text,
        message_id varchar(200),
        created_at timestamptz NOT NULL DEFAULT now(),
        sent_at timestamptz
      )`);
    await q.query(`CREATE INDEX email_deliveries_letter_idx ON email_deliveries (letter_id)`);
    await q.query(`CREATE INDEX email_deliveries_org_idx ON email_deliveries (organization_id, created_at)`);
    await q.query(`
      CREATE TABLE fake_mailbox (
        id bigserial PRIMARY KEY,
        received_at timestamptz NOT NULL DEFAULT now(),
        envelope_from varchar(254),
        envelope_to text[] NOT NULL,
        subject text,
        message_id text,
        text_body text,
        html_body text,
        attachments jsonb NOT NULL DEFAULT '[]',
        raw bytea NOT NULL
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE fake_mailbox`);
    await q.query(`DROP TABLE email_deliveries`);
    await q.query(`DROP TABLE letter_acknowledgements`);
    await q.query(`DROP TABLE clearance_letters`);
  }
}
