import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Each person chooses which kinds of notice also come by e-mail (the in-app notice always appears).
 * One row per membership and kind switched off: e-mail is on unless a row says otherwise, so every
 * kind added later starts on for everyone. Emergency kinds are refused by the API before they reach
 * here, and notify() ignores any row for them, so an emergency e-mail can never be switched off.
 * Rows go with their membership (ON DELETE CASCADE).
 */
export class CreateNoticeEmailOptOuts1765813000000 implements MigrationInterface {
  name = 'CreateNoticeEmailOptOuts1765813000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE notice_email_opt_outs (
        member_id uuid NOT NULL CONSTRAINT notice_email_opt_outs_member_fkey REFERENCES memberships(id) ON DELETE CASCADE,
        kind varchar(40) NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT notice_email_opt_outs_pkey PRIMARY KEY (member_id, kind)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE notice_email_opt_outs`);
  }
}
