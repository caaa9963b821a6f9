import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Letters that never go stale, on the right paper.
 * - organizations.letter_paper: 'letter' or 'a4' as the admin chose; NULL (every existing organization)
 *   means "the paper of the time zone's country", so nothing changes for anyone until they choose.
 * - clearance_letters.limits_basis: the status and limits a signed letter rests on, so a later plan or
 *   status change can be compared with it on each read. Letters signed before this have none and are
 *   never marked out of date (what they rested on was not recorded).
 */
export class AddLetterPaperAndBasis1765830000000 implements MigrationInterface {
  name = 'AddLetterPaperAndBasis1765830000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE organizations ADD COLUMN letter_paper varchar(6) NULL CHECK (letter_paper IN ('letter', 'a4'))`);
    await q.query(`ALTER TABLE clearance_letters ADD COLUMN limits_basis jsonb NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE clearance_letters DROP COLUMN limits_basis`);
    await q.query(`ALTER TABLE organizations DROP COLUMN letter_paper`);
  }
}
