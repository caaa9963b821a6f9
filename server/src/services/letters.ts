import { createHash, randomBytes } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { letterPaperOf, type LetterPaper } from '../../../policies/letter-paper';
import { letterStanding, type LetterStanding, type SignedLetterDates } from '../../../policies/letters';
import type { LetterData } from '../../../templates/letter/clearance-letter';
import { memberContacts } from '../queries/members';

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

/** What the PDF prints besides the letter row: whom it is about, who signs, and the organization's paper and clock. */
export interface LetterPrintContext {
  organizationName: string;
  athleteName: string;
  athleteDateOfBirth: string | null;
  clinicianContact: string;
  paper: LetterPaper;
  timeZone: string;
}

/** The print context of a letter about `athleteId`, signed (or to be signed) by `clinicianId`. */
export async function letterPrintContext(
  db: DataSource | EntityManager,
  organizationId: string,
  athleteId: string,
  clinicianId: string,
): Promise<LetterPrintContext> {
  const [org]: { name: string; time_zone: string; country: string | null; letter_paper: LetterPaper | null }[] = await db.query(
    `SELECT name, time_zone, country, letter_paper FROM organizations WHERE id = $1`,
    [organizationId],
  );
  const [profile]: { date_of_birth: string | null }[] = await db.query(
    `SELECT date_of_birth FROM athlete_profiles WHERE membership_id = $1`,
    [athleteId],
  );
  const people = await memberContacts(db, [athleteId, clinicianId]);
  return {
    organizationName: org.name,
    athleteName: people.get(athleteId)?.name ?? '',
    athleteDateOfBirth: profile?.date_of_birth ?? null,
    clinicianContact: people.get(clinicianId)?.email ?? '',
    paper: letterPaperOf({ letterPaper: org.letter_paper, country: org.country, timeZone: org.time_zone }),
    timeZone: org.time_zone,
  };
}

/** What a letter's PDF says of a letter row; the caller adds the signature, signing instant, code and check link. */
export function letterPdfData(
  l: Pick<
    LetterData,
    'decision' | 'effectiveFrom' | 'validUntil' | 'limits' | 'clinicianName' | 'credential' | 'licenceNumber' | 'familyNote'
  >,
  context: LetterPrintContext,
): Omit<LetterData, 'signature' | 'signedAt' | 'verificationCode' | 'checkUrl'> {
  return {
    ...context,
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
