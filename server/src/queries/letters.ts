import type { DataSource, EntityManager } from 'typeorm';
import { asSubject, type AppAbility } from '../../../policies/access';
import type { LetterCheckDto, LetterDto } from '../../../policies/dto';
import { dayIn, orgToday } from '../../../policies/today';
import { decisionWords, renderLetterPdf } from '../../../templates/letter/clearance-letter';
import { ClearanceLetter } from '../entities';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery, publicQuery } from '../core/command';
import { hashCode, initials, letterPdfData, signedLetterDates, standingToday } from '../services/letters';
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
  return letters.map((l) => {
    const standing = l.status === 'draft' ? { status: 'draft' as const, supersededBy: null } : standingToday(l, dates, today);
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

/** A draft as a PDF marked DRAFT, without a code or check link: for the clinicians who may sign it. */
export const letterPreview = orgQuery<{ id: string }, { pdf: Buffer; filename: string }>({
  name: 'letters.preview',
  async run({ db, ability, actor, now }, { id }) {
    const l = await db.getRepository(ClearanceLetter).findOne({ where: { id, organizationId: actor.organizationId } });
    authorize(ability, 'update', 'Letter', l);
    const pdf = await renderLetterPdf({
      ...letterPdfData(l, actor.organizationName, await memberName(db, l.athleteId, '')),
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
 * dates, decision and initials only — never the athlete's name, notes or limits.
 */
export async function letterCheck(db: Db, code: string, now: Date): Promise<LetterCheckDto> {
  const rows: {
    id: string;
    athlete_id: string;
    decision: 'full' | 'limited';
    effective_from: string;
    valid_until: string | null;
    signed_at: Date;
    org: string;
    time_zone: string;
  }[] = await db.query(
    `SELECT l.id, l.athlete_id, l.decision, l.effective_from, l.valid_until, l.signed_at, o.name AS org, o.time_zone
       FROM clearance_letters l JOIN organizations o ON o.id = l.organization_id
      WHERE l.code_hash = $1 AND l.status <> 'draft'`,
    [hashCode(code)],
  );
  const r = rows[0];
  if (!r) return { status: 'unknown' };
  const dates = await signedLetterDates(db, [r.athlete_id]);
  const standing = standingToday({ id: r.id, athleteId: r.athlete_id }, dates, orgToday(r.time_zone, now));
  return {
    status: standing.status === 'signed' ? 'valid' : standing.status,
    athleteInitials: initials(await memberName(db, r.athlete_id, '')),
    decision: decisionWords({ decision: r.decision, effectiveFrom: r.effective_from }),
    effectiveFrom: r.effective_from,
    validUntil: r.valid_until,
    organizationName: r.org,
    issuedOn: dayIn(r.time_zone, new Date(r.signed_at)),
  };
}

/** The public letter check as a query open to anyone: validity, dates and decision only. */
export const letterCheckQuery = publicQuery({
  name: 'letters.check',
  run: (ctx, code: string) => letterCheck(ctx.db, code, ctx.now),
});
