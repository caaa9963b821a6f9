import { createHash, randomBytes } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { describeRule } from '../../../policies/load/describe';
import { inForceOn } from '../../../policies/load/in-force';
import { MOVEMENT_PATTERNS } from '../../../policies/load/patterns';
import { letterStanding, type LetterStanding, type SignedLetterDates } from '../../../policies/letters';
import type { LetterData } from '../../../templates/letter/clearance-letter';
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
 * A signed letter's standing on `today`, the organization's local day (policies/today.ts). The stored
 * status and superseded_by say only that a later letter was signed; whether it has taken over yet
 * depends on its start date, so the standing is worked out on each read and never stored.
 */
export function standingToday(
  letter: { id: string; athleteId: string },
  dates: Map<string, SignedLetterDates[]>,
  today: string,
): LetterStanding {
  const all = dates.get(letter.athleteId) ?? [];
  const self = all.find((d) => d.id === letter.id);
  if (!self) throw new Error(`Letter ${letter.id} is not among its athlete's signed letters`);
  return letterStanding(self, all, today);
}

/** What a letter's PDF says of a letter row; the caller adds the signature, signing instant, code and check link. */
export function letterPdfData(
  l: Pick<
    LetterData,
    'decision' | 'effectiveFrom' | 'validUntil' | 'limits' | 'clinicianName' | 'credential' | 'licenceNumber' | 'familyNote'
  >,
  organizationName: string,
  athleteName: string,
): Omit<LetterData, 'signature' | 'signedAt' | 'verificationCode' | 'checkUrl'> {
  return {
    organizationName,
    athleteName,
    decision: l.decision,
    effectiveFrom: l.effectiveFrom,
    validUntil: l.validUntil,
    limits: l.limits,
    clinicianName: l.clinicianName,
    credential: l.credential,
    licenceNumber: l.licenceNumber,
    familyNote: l.familyNote,
  };
}
