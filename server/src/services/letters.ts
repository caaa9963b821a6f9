import { createHash, randomBytes } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { LetterDto } from '../../../policies/dto';
import { describeRule } from '../../../policies/load/describe';
import { inForceOn } from '../../../policies/load/in-force';
import { MOVEMENT_PATTERNS } from '../../../policies/load/patterns';
import { asSubject } from '../../../policies/access';
import { letterStanding, type LetterStanding, type SignedLetterDates } from '../../../policies/letters';
import { todayIso } from '../../../policies/roles';
import { ClearanceLetter } from '../entities';
import { activePlans } from './cases';

const CROCKFORD = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

/** 100 random bits as 20 Crockford base32 characters, grouped by four: easy to read aloud and type. */
export function newVerificationCode(): string {
  const bytes = randomBytes(13);
  let bits = 0n;
  for (const b of bytes) bits = (bits << 8n) | BigInt(b);
  let out = '';
  for (let i = 0; i < 20; i++) {
    out += CROCKFORD[Number(bits & 31n)];
    bits >>= 5n;
  }
  return out.match(/.{4}/g)!.join('-');
}

/** Case, dashes and the look-alikes (I, L → 1; O → 0) do not matter when a code is typed back. */
export function normalizeCode(code: string): string {
  return code.toUpperCase().replace(/[\s-]/g, '').replace(/[IL]/g, '1').replace(/O/g, '0');
}

export const hashCode = (code: string) => createHash('sha256').update(normalizeCode(code)).digest('hex');

/** The limits in force on a date, in the plain words athletes and families read. */
export async function limitsInForce(m: EntityManager, athleteId: string, date: string): Promise<string[]> {
  const plans = (await activePlans(m, [athleteId], date)).get(athleteId) ?? [];
  const inForce = inForceOn(plans, date);
  return MOVEMENT_PATTERNS.filter((p) => inForce.patterns[p].mode !== 'free').map((p) => describeRule(p, inForce.patterns[p], 'kg'));
}

export function initials(name: string): string {
  return name
    .split(/\s+/)
    .filter(Boolean)
    .map((w) => `${w[0].toUpperCase()}.`)
    .join(' ');
}

/** Every signed letter of these athletes with its start date, signing instant and valid-until day, by athlete. */
export async function signedLetterDates(db: DataSource | EntityManager, athleteIds: string[]): Promise<Map<string, SignedLetterDates[]>> {
  const rows: { id: string; athlete_id: string; effective_from: string; signed_at: Date; valid_until: string | null }[] = await db.query(
    `SELECT id, athlete_id, effective_from, signed_at, valid_until FROM clearance_letters WHERE athlete_id = ANY($1) AND status <> 'draft'`,
    [athleteIds],
  );
  const by = new Map<string, SignedLetterDates[]>();
  for (const r of rows) {
    const list = by.get(r.athlete_id) ?? [];
    list.push({ id: r.id, effectiveFrom: r.effective_from, signedAt: new Date(r.signed_at).toISOString(), validUntil: r.valid_until });
    by.set(r.athlete_id, list);
  }
  return by;
}

/**
 * A signed letter's standing today (UTC, as everywhere on the server). The stored status and
 * superseded_by say only that a later letter was signed; whether it has taken over yet depends on its
 * start date, so the standing is worked out on each read and never stored.
 */
export function standingToday(
  letter: { id: string; athleteId: string },
  dates: Map<string, SignedLetterDates[]>,
  today = todayIso(),
): LetterStanding {
  const all = dates.get(letter.athleteId) ?? [];
  const self = all.find((d) => d.id === letter.id);
  if (!self) throw new Error(`Letter ${letter.id} is not among its athlete's signed letters`);
  return letterStanding(self, all, today);
}

export async function listLetters(
  db: DataSource | EntityManager,
  ability: AppAbility,
  organizationId: string,
  where: { athleteId?: string; id?: string },
): Promise<LetterDto[]> {
  const qb = db
    .getRepository(ClearanceLetter)
    .createQueryBuilder('l')
    .where('l.organization_id = :org', { org: organizationId })
    .orderBy('l.created_at', 'DESC')
    .limit(200);
  if (where.athleteId) qb.andWhere('l.athlete_id = :a', { a: where.athleteId });
  if (where.id) qb.andWhere('l.id = :id', { id: where.id });
  // A draft is the signing clinicians' working copy (not signed, not valid): nobody else sees it.
  const letters = (await qb.getMany()).filter((l) => {
    const s = asSubject('Letter', { id: l.id, organizationId: l.organizationId, athleteId: l.athleteId });
    return ability.can('read', s, 'content') && (l.status !== 'draft' || ability.can('update', s));
  });
  if (letters.length === 0) return [];
  const ids = letters.map((l) => l.id);
  const signed = letters.filter((l) => l.status !== 'draft');
  const [names, acks, deliveries, dates] = await Promise.all([
    db.query(`SELECT m.id, u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.id = ANY($1)`, [
      letters.map((l) => l.athleteId),
    ]) as Promise<{ id: string; name: string }[]>,
    db.query(
      `SELECT a.letter_id, a.guardian_id, u.display_name AS name, a.acknowledged_at FROM letter_acknowledgements a
               JOIN memberships m ON m.id = a.guardian_id JOIN users u ON u.id = m.user_id WHERE a.letter_id = ANY($1)`,
      [ids],
    ) as Promise<{ letter_id: string; guardian_id: string; name: string; acknowledged_at: Date }[]>,
    db.query(
      `SELECT id, letter_id, to_address, status, attempts, last_error, sent_at FROM email_deliveries WHERE letter_id = ANY($1) ORDER BY created_at`,
      [ids],
    ) as Promise<
      {
        id: string;
        letter_id: string;
        to_address: string;
        status: string;
        attempts: number;
        last_error: string | null;
        sent_at: Date | null;
      }[]
    >,
    signedLetterDates(db, [...new Set(signed.map((l) => l.athleteId))]),
  ]);
  const today = todayIso();
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
      athleteName: names.find((n) => n.id === l.athleteId)?.name ?? '',
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
        .map((a) => ({ guardianId: a.guardian_id, guardianName: a.name, acknowledgedAt: new Date(a.acknowledged_at).toISOString() })),
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
