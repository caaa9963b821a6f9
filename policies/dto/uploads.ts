/** Uploaded records: case documents and technique clips with their notes. Response shapes shared by server and client; types only. */

/** An outside document (physician's note, imaging report, referral) attached to a case. */
export interface CaseDocumentDto {
  id: string;
  caseId: string;
  athleteId: string;
  title: string;
  /** The date written on the document, 'YYYY-MM-DD'. */
  documentDate: string;
  issuedBy: string;
  /** Detected from the file's own bytes, e.g. 'application/pdf', 'image/jpeg', 'image/png', 'image/heic'. */
  mediaType: string;
  sizeBytes: number;
  sha256: string;
  uploadedByName: string;
  uploadedByUserId: string;
  uploadedAt: string;
  /** API path that downloads it (attachment, no-store). */
  downloadPath: string;
}
export interface ClipNoteDto {
  id: string;
  clipId: string;
  /** Where in the clip the note is pinned, in milliseconds. */
  atMs: number;
  body: string;
  authorName: string;
  authorUserId: string;
  authorRole: 'athlete' | 'coach' | 'clinician';
  createdAt: string;
}
/** A short technique video of a set, linked to a logged session and one exercise in it. */
export interface ClipDto {
  id: string;
  athleteId: string;
  athleteName: string;
  trainingLogId: string;
  /** The logged session's date. */
  sessionDate: string;
  exercise: string;
  caption: string | null;
  /** Detected from the file's own bytes: 'video/webm', 'video/mp4' or 'video/quicktime'. */
  mediaType: string;
  sizeBytes: number;
  uploadedByName: string;
  uploadedByUserId: string;
  uploadedAt: string;
  /** API path of the video, served with range requests. */
  videoPath: string;
  noteCount: number;
  /** Present on GET one clip; lists omit it. */
  notes?: ClipNoteDto[];
}
