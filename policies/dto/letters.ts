/** Clearance letters, their public check, and e-mail deliveries. Response shapes shared by server and client; types only. */

export interface LetterDto {
  id: string;
  athleteId: string;
  athleteName: string;
  decision: 'full' | 'limited';
  effectiveFrom: string;
  validUntil: string | null;
  limits: string[];
  clinicianName: string;
  credential: string;
  licenceNumber: string;
  familyNote: string;
  signature: string | null;
  signedAt: string | null;
  /**
   * As of the organization's today (policies/today.ts): 'signed' is the letter in force, 'scheduled' a
   * signed letter whose start date is still ahead, 'superseded' one a later-signed letter has replaced
   * from that letter's start date, 'expired' the latest letter once its valid-until day has passed
   * (nothing is in force until a new one is signed).
   */
  status: 'draft' | 'scheduled' | 'signed' | 'expired' | 'superseded';
  /** The letter that took over from this one; null until that letter's start date has come. */
  supersededBy: string | null;
  /**
   * In force (or scheduled) but no longer stating what is in force: the plan or status changed after
   * it was signed. Worked out on each read; signing the updated letter ends it.
   */
  outOfDate: boolean;
  pdfSha256: string | null;
  version: number;
  createdAt: string;
  acknowledgements: { guardianId: string; guardianName: string; acknowledgedAt: string }[];
  /** Clinicians and admins only. */
  deliveries?: { id: string; to: string; status: string; attempts: number; lastError: string | null; sentAt: string | null }[];
  /** Shown once, in the response that signs the letter. */
  verificationCode?: string;
}
export interface LetterCheckDto {
  /**
   * 'scheduled': genuine and signed, but its start date is still ahead (the earlier letter is in force).
   * 'expired': genuine and not replaced, but its valid-until day has passed.
   */
  status: 'valid' | 'scheduled' | 'expired' | 'superseded' | 'unknown';
  athleteInitials?: string;
  decision?: string;
  effectiveFrom?: string;
  validUntil?: string | null;
  organizationName?: string;
  issuedOn?: string;
  /** The clinician has made a newer decision than this letter states (no detail of what it is). */
  newerDecision?: boolean;
}
/** The updated letter's form, filled in from the status and limits in force today. */
export interface LetterPrefillDto {
  athleteId: string;
  /** The athlete's participation status today. */
  status: 'out' | 'limited' | 'full';
  /** Null while the athlete is Out: a clearance letter clears for full or limited participation. */
  decision: 'full' | 'limited' | null;
  effectiveFrom: string;
  validUntil: string | null;
  /** The limit lines the letter will print, in the family's unit. */
  limits: string[];
  credential: string;
  licenceNumber: string;
}
export interface OutboxMessageDto {
  id: string;
  receivedAt: string;
  to: string[];
  subject: string | null;
  text: string | null;
  attachments: { filename: string; contentType: string; size: number }[];
}
export interface DeliveryDto {
  id: string;
  kind: string;
  to: string;
  subject: string;
  status: 'queued' | 'sending' | 'sent' | 'failed';
  attempts: number;
  lastError: string | null;
  createdAt: string;
  sentAt: string | null;
}
