/** A request for a person's whole record, as its requester sees it. */
export interface RecordExportDto {
  id: string;
  athleteId: string;
  athleteName: string;
  /** preparing: queued or being built; ready: e-mailed, the link works until `expiresAt`; failed; expired. */
  state: 'preparing' | 'ready' | 'failed' | 'expired';
  requestedAt: string;
  readyAt: string | null;
  expiresAt: string | null;
  downloadedAt: string | null;
  sizeBytes: number | null;
  /** Why it failed, in a sentence, when it did. */
  problem: string | null;
}

/** Whose record the reader may ask for (themself; a guardian's minors), and their requests. */
export interface RecordExportsDto {
  people: { athleteId: string; athleteName: string; self: boolean }[];
  requests: RecordExportDto[];
}

/** What an e-mailed link opens to, before the download itself. */
export type RecordExportLinkDto =
  | { state: 'ready'; athleteName: string; expiresAt: string; sizeBytes: number }
  | { state: 'expired'; athleteName: string; expiresAt: string }
  | { state: 'unknown' };
