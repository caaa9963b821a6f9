import type { DataSource, EntityManager } from 'typeorm';
import { asSubject, type AppAbility } from '../../../policies/access';
import type { LetterCheckDto, LetterDto, LetterPrefillDto } from '../../../policies/dto';
import type { LetterBasis } from '../../../policies/letter-basis';
import { dayIn, orgToday } from '../../../policies/today';
import { decisionWords, renderLetterPdf } from '../../../templates/letter/clearance-letter';
import { ClearanceLetter } from '../entities';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery, publicQuery } from '../core/command';
import { outOfDateLetters, updatedLetterPrefill } from '../services/letter-staleness';
import { hashCode, initials, letterPdfData, letterPrintContext, signedLetterDates, standingToday } from '../services/letters';
import { memberName, memberNames } from './members';

type Db = DataSource | EntityManager;

const LETTER_COLUMNS = { id: 'l.id', organizationId: 'l.organization_id', athleteId: 'l.athlete_id' };

/**
 * The letters a reader may see, newest first, each with its standing on `today` (the organization's
 * day). Filtered in SQL by the access rules: the read rules (every one of them covers the letter's
 * content), and a draft — the signing clinicians' working copy, not signed, not valid — only for
 * those who may update it. Queries run one after another, so this also runs inside a command's
 * transaction (one client runs one query at a time).
 */
export async function lettersFor(
  db: Db,
  ability: AppAbility,
  organizationId: string,
  today: string,
  where: { athleteId?: string; id?: string },
): Promise<LetterDto[]> {
  const read = accessibleWhere(ability, 'read', 'Letter', LETTER_COLUMNS, 'r');
  const update = accessibleWhere(ability, 'update', 'Letter', LETTER_COLUMNS, 'u');
  const qb = db
    .getRepository(ClearanceLetter)
    .createQueryBuilder('l')
    .where('l.organization_id = :org', { org: organizationId })
    .andWhere(read.sql, read.params)
    .andWhere(`(l.status <> 'draft' OR ${update.sql})`, update.params)
    .orderBy('l.created_at', 'DESC')
    .limit(200);
  if (where.athleteId) qb.andWhere('l.athlete_id = :a', { a: where.athleteId });
  if (where.id) qb.andWhere('l.id = :id', { id: where.id });
  const letters = await qb.getMany();
  if (letters.length === 0) return [];
  const ids = letters.map((l) => l.id);
  const acks: { letter_id: string; guardian_id: string; acknowledged_at: Date }[] = await db.query(
    `SELECT letter_id, guardian_id, acknowledged_at FROM letter_acknowledgements WHERE letter_id = ANY($1) ORDER BY acknowledged_at`,
    [ids],
  );
  const deliveries: {
    id: string;
    letter_id: string;
    to_address: string;
    status: string;
    attempts: number;
    last_error: string | null;
    sent_at: Date | null;
  }[] = await db.query(
    `SELECT id, letter_id, to_address, status, attempts, last_error, sent_at FROM email_deliveries WHERE letter_id = ANY($1) ORDER BY created_at`,
    [ids],
  );
  const names = await memberNames(db, [...letters.map((l) => l.athleteId), ...acks.map((a) => a.guardian_id)]);
  const dates = await signedLetterDates(db, [...new Set(letters.filter((l) => l.status !== 'draft').map((l) => l.athleteId))]);
  const standings = new Map(
    letters.map((l) => [l.id, l.status === 'draft' ? { status: 'draft' as const, supersededBy: null } : standingToday(l, dates, today)]),
  );
  const stale = await outOfDateLetters(
    db,
    letters.map((l) => ({ ...l, standing: standings.get(l.id)!.status })),
    today,
  );
  return letters.map((l) => {
    const standing = standings.get(l.id)!;
    const seeDeliveries = ability.can(
      'read',
      asSubject('Letter', { id: l.id, organizationId: l.organizationId, athleteId: l.athleteId }),
      'deliveries',
    );
    return {
      id: l.id,
      athleteId: l.athleteId,
      athleteName: names.get(l.athleteId) ?? '',
      decision: l.decision,
      effectiveFrom: l.effectiveFrom,
      validUntil: l.validUntil,
      limits: l.limits,
      clinicianName: l.clinicianName,
      credential: l.credential,
      licenceNumber: l.licenceNumber,
      familyNote: l.familyNote,
      signature: l.signature,
      signedAt: l.signedAt ? l.signedAt.toISOString() : null,
      status: standing.status,
      supersededBy: standing.supersededBy,
      outOfDate: stale.has(l.id),
      pdfSha256: l.pdfSha256,
      version: l.version,
      createdAt: l.createdAt.toISOString(),
      acknowledgements: acks
        .filter((a) => a.letter_id === l.id)
        .map((a) => ({
          guardianId: a.guardian_id,
          guardianName: names.get(a.guardian_id) ?? '',
          acknowledgedAt: new Date(a.acknowledged_at).toISOString(),
        })),
      ...(seeDeliveries
        ? {
            deliveries: deliveries
              .filter((d) => d.letter_id === l.id)
              .map((d) => ({
                id: d.id,
                to: d.to_address,
                status: d.status,
                attempts: d.attempts,
                lastError: d.last_error,
                sentAt: d.sent_at ? new Date(d.sent_at).toISOString() : null,
              })),
          }
        : {}),
    };
  });
}

/** Clearance letters the reader may see (delivery status for clinicians and admins). */
export const letters = orgQuery<{ athleteId?: string }, LetterDto[]>({
  name: 'letters.list',
  run: ({ db, ability, actor, today }, where) => lettersFor(db, ability, actor.organizationId, today, where),
});

/**
 * The updated letter's form for an athlete, filled in from the status and limits in force today, with
 * the credential and licence of the athlete's latest signed letter: for those who may write letters.
 */
export const letterPrefill = orgQuery<{ athleteId: string }, LetterPrefillDto>({
  name: 'letters.prefill',
  async run({ db, ability, actor, today }, { athleteId }) {
    authorize(ability, 'create', 'Letter', { id: '', organizationId: actor.organizationId, athleteId });
    const [previous]: { credential: string; licence_number: string }[] = await db.query(
      `SELECT credential, licence_number FROM clearance_letters
        WHERE organization_id = $1 AND athlete_id = $2 AND status <> 'draft' ORDER BY signed_at DESC LIMIT 1`,
      [actor.organizationId, athleteId],
    );
    return updatedLetterPrefill(
      db,
      athleteId,
      today,
      previous ? { credential: previous.credential, licenceNumber: previous.licence_number } : null,
    );
  },
});

/** A draft as a PDF marked DRAFT, without a code or check link: for the clinicians who may sign it. */
export const letterPreview = orgQuery<{ id: string }, { pdf: Buffer; filename: string }>({
  name: 'letters.preview',
  async run({ db, ability, actor, now }, { id }) {
    const l = await db.getRepository(ClearanceLetter).findOne({ where: { id, organizationId: actor.organizationId } });
    authorize(ability, 'update', 'Letter', l);
    const pdf = await renderLetterPdf({
      ...letterPdfData(l, await letterPrintContext(db, actor.organizationId, l.athleteId, actor.membershipId)),
      draft: true,
      verificationCode: '',
      checkUrl: '',
      signature: '',
      signedAt: now.toISOString(),
    });
    return { pdf, filename: `draft-letter-${l.effectiveFrom}.pdf` };
  },
});

/**
 * The public check of a verification code: the standing on the issuing organization's today, with
 * dates, decision and initials only — never the athlete's name, notes or limits — and whether the
 * clinician has since made a newer decision (never which).
 */
export async function letterCheck(db: Db, code: string, now: Date): Promise<LetterCheckDto> {
  const rows: {
    id: string;
    athlete_id: string;
    decision: 'full' | 'limited';
    effective_from: string;
    valid_until: string | null;
    signed_at: Date;
    limits_basis: LetterBasis | null;
    org: string;
    time_zone: string;
  }[] = await db.query(
    `SELECT l.id, l.athlete_id, l.decision, l.effective_from, l.valid_until, l.signed_at, l.limits_basis, o.name AS org, o.time_zone
       FROM clearance_letters l JOIN organizations o ON o.id = l.organization_id
      WHERE l.code_hash = $1 AND l.status <> 'draft'`,
    [hashCode(code)],
  );
  const r = rows[0];
  if (!r) return { status: 'unknown' };
  const dates = await signedLetterDates(db, [r.athlete_id]);
  const today = orgToday(r.time_zone, now);
  const standing = standingToday({ id: r.id, athleteId: r.athlete_id }, dates, today);
  const stale = await outOfDateLetters(
    db,
    [{ id: r.id, athleteId: r.athlete_id, effectiveFrom: r.effective_from, limitsBasis: r.limits_basis, standing: standing.status }],
    today,
  );
  return {
    status: standing.status === 'signed' ? 'valid' : standing.status,
    athleteInitials: initials(await memberName(db, r.athlete_id, '')),
    decision: decisionWords({ decision: r.decision, effectiveFrom: r.effective_from }),
    effectiveFrom: r.effective_from,
    validUntil: r.valid_until,
    organizationName: r.org,
    issuedOn: dayIn(r.time_zone, new Date(r.signed_at)),
    // Only that a newer decision exists: never what it is (the check page carries no medical detail).
    ...(stale.has(r.id) ? { newerDecision: true } : {}),
  };
}

/** The public letter check as a query open to anyone: validity, dates and decision only. */
export const letterCheckQuery = publicQuery({
  name: 'letters.check',
  run: (ctx, code: string) => letterCheck(ctx.db, code, ctx.now),
});
