import type { DataSource, EntityManager } from 'typeorm';
import { letterBasis, sameBasis, type LetterBasis } from '../../../policies/letter-basis';
import { letterLimitLines } from '../../../policies/letters';
import { inForceOn } from '../../../policies/load/in-force';
import type { LetterPrefillDto } from '../../../policies/dto';
import type { Unit } from '../../../policies/schemas/common';
import { memberNames } from '../queries/members';
import { activePlans, athleteStatuses } from './cases';
import { athleteCircle, notify } from './notify';

type Db = DataSource | EntityManager;

/**
 * A signed letter is out of date when what it states — its decision and the limits in force when it
 * was signed — no longer matches the status and limits in force now. It is worked out on each read
 * from the stored basis and the current plans and statuses, so it can never drift from them; signing
 * the updated letter (which supersedes this one) ends it.
 */

/** What is in force for an athlete on `date`: the status, the limits as data, and the next review. */
async function inForce(db: Db, athleteId: string, date: string) {
  const status = (await athleteStatuses(db, [athleteId], date)).get(athleteId)!;
  const patterns = inForceOn((await activePlans(db, [athleteId], date)).get(athleteId) ?? [], date).patterns;
  return { status: status.status, nextReview: status.nextReview, patterns, basis: letterBasis(status.status, patterns) };
}

/** The day a letter's statement is compared on: its start date while ahead, else today. */
const comparedOn = (effectiveFrom: string, today: string) => (effectiveFrom > today ? effectiveFrom : today);

/** What a letter with this decision states, as data: a Full letter states no limits at all. */
export async function basisOfLetter(
  db: Db,
  letter: { athleteId: string; decision: 'full' | 'limited'; effectiveFrom: string },
  today: string,
) {
  const now = await inForce(db, letter.athleteId, comparedOn(letter.effectiveFrom, today));
  return letter.decision === 'full' ? { status: 'full' as const, patterns: {} } : { ...now.basis, status: 'limited' as const };
}

export interface StalenessCandidate {
  id: string;
  athleteId: string;
  effectiveFrom: string;
  limitsBasis: LetterBasis | null;
  /** The letter's standing today: only a letter in force or scheduled can be out of date. */
  standing: string;
}

/** The ids of the letters that are in force (or scheduled) and no longer state what is in force. */
export async function outOfDateLetters(db: Db, letters: StalenessCandidate[], today: string): Promise<Set<string>> {
  const out = new Set<string>();
  const cache = new Map<string, Promise<LetterBasis>>();
  for (const l of letters) {
    if (!l.limitsBasis || (l.standing !== 'signed' && l.standing !== 'scheduled')) continue;
    const on = comparedOn(l.effectiveFrom, today);
    const key = `${l.athleteId}|${on}`;
    if (!cache.has(key))
      cache.set(
        key,
        inForce(db, l.athleteId, on).then((n) => n.basis),
      );
    if (!sameBasis(l.limitsBasis, await cache.get(key)!)) out.add(l.id);
  }
  return out;
}

/**
 * The unit the family reads: the athlete's guardians' choice (the first-linked guardian's when they
 * differ), else the athlete's own.
 */
export async function familyUnit(db: Db, athleteId: string): Promise<Unit> {
  const rows: { unit_pref: Unit }[] = await db.query(
    `SELECT u.unit_pref FROM (
        SELECT g.guardian_id AS member_id, 0 AS rank, g.created_at FROM guardian_links g WHERE g.athlete_id = $1
        UNION ALL SELECT $1::uuid, 1, now()
      ) who
      JOIN memberships m ON m.id = who.member_id AND m.active
      JOIN users u ON u.id = m.user_id
      ORDER BY who.rank, who.created_at LIMIT 1`,
    [athleteId],
  );
  return rows[0]?.unit_pref ?? 'kg';
}

/** The limit lines in force for an athlete on `date`, as a letter prints them for the family. */
export async function letterLinesOn(db: Db, athleteId: string, date: string): Promise<string[]> {
  const { patterns } = await inForce(db, athleteId, date);
  return letterLimitLines(patterns, await familyUnit(db, athleteId));
}

/**
 * The updated letter, filled in from what is in force today: Full or Limited as the status now is
 * (no decision while the athlete is Out: a clearance letter clears for one of the two), the limit
 * lines, the next review, and the signer's credential and licence from the letter it replaces.
 */
export async function updatedLetterPrefill(
  db: Db,
  athleteId: string,
  today: string,
  previous: { credential: string; licenceNumber: string } | null,
): Promise<LetterPrefillDto> {
  const now = await inForce(db, athleteId, today);
  return {
    athleteId,
    status: now.status,
    decision: now.status === 'out' ? null : now.status,
    effectiveFrom: today,
    validUntil: now.nextReview,
    limits: letterLimitLines(now.patterns, await familyUnit(db, athleteId)),
    credential: previous?.credential ?? '',
    licenceNumber: previous?.licenceNumber ?? '',
  };
}

/**
 * Called from the one "limits changed" path: for each athlete whose letter in force (or scheduled)
 * no longer states what is in force, the clinicians of the care team get a notice — one until they
 * have read it, so a run of edits does not flood them.
 */
export async function noticeStaleLetters(m: EntityManager, organizationId: string, today: string, athleteIds: string[]): Promise<void> {
  if (athleteIds.length === 0) return;
  const rows: { id: string; athlete_id: string; effective_from: string; limits_basis: LetterBasis | null; updated_at: Date }[] =
    await m.query(
      `SELECT id, athlete_id, effective_from, limits_basis, updated_at FROM clearance_letters
      WHERE organization_id = $1 AND athlete_id = ANY($2) AND status = 'signed' AND limits_basis IS NOT NULL
        AND (valid_until IS NULL OR valid_until >= $3)`,
      [organizationId, athleteIds, today],
    );
  // status = 'signed' is the latest-signed letter of each athlete: the one in force or about to be.
  const stale = await outOfDateLetters(
    m,
    rows.map((r) => ({
      id: r.id,
      athleteId: r.athlete_id,
      effectiveFrom: r.effective_from,
      limitsBasis: r.limits_basis,
      standing: 'signed',
    })),
    today,
  );
  const names = await memberNames(m, [...new Set(rows.map((r) => r.athlete_id))]);
  for (const r of rows.filter((x) => stale.has(x.id))) {
    const { clinicians } = await athleteCircle(m, r.athlete_id);
    // Since the letter was signed (a signed letter's row changes no more), on the database's clock like the notices'.
    const unread: { recipient_id: string }[] = await m.query(
      `SELECT recipient_id FROM notifications WHERE kind = 'letter_out_of_date' AND athlete_id = $1 AND read_at IS NULL AND created_at >= $2`,
      [r.athlete_id, r.updated_at],
    );
    const told = new Set(unread.map((u) => u.recipient_id));
    const name = names.get(r.athlete_id) ?? 'An athlete';
    await notify(
      m,
      clinicians.filter((c) => !told.has(c)),
      {
        organizationId,
        athleteId: r.athlete_id,
        kind: 'letter_out_of_date',
        severity: 'routine',
        title: `${name}'s clearance letter is out of date`,
        body: `The plan or status changed, and the signed letter no longer states what ${name} may do now. Write the updated letter from ${name}'s page; signing it replaces the old one.`,
      },
    );
  }
}
