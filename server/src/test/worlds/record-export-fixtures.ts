import { Readable } from 'node:stream';
import type { DataSource } from 'typeorm';
import type { Config } from '../../config';
import { CaseDocument, CaseRecord, CheckIn, Clip, PainReport, TrainingLog } from '../../entities';
import { createStorage } from '../../storage';
import type { TestOrg } from '../factories';
import { PDF, webm } from './uploads-fixtures';

/** Strings planted in records the ZIP must or must not carry. */
export const CLINICAL_NOTE = 'CLINICAL-NOTE-ONLY-FOR-THE-CARE-TEAM';
export const DIAGNOSIS = 'Patellar tendinopathy, left';
export const PAIN_NARRATIVE = 'ATHLETE-PAIN-NARRATIVE';
export const OTHER_PERSON = 'ANOTHER-ATHLETES-LOG';

/**
 * A whole record for one athlete of `o`: a case with a diagnosis and a clinical note, a pain report,
 * a check-in, a log (and another athlete's log), a PDF document and a clip in storage.
 */
export async function plantRecord(ds: DataSource, config: Config, o: TestOrg) {
  const a = o.athlete.membershipId;
  const c = await ds.getRepository(CaseRecord).save({
    organizationId: o.id,
    athleteId: a,
    bodyRegions: ['knee_left'],
    onsetDate: '2026-11-01',
    diagnosis: DIAGNOSIS,
    clinicalNotes: CLINICAL_NOTE,
    reviewDate: null,
    openedBy: null,
  });
  await ds.getRepository(PainReport).save({
    organizationId: o.id,
    athleteId: a,
    reportedBy: o.athlete.userId,
    bodyRegions: ['knee_left'],
    painNow: 3,
    painWorst24h: 4,
    onsetDate: '2026-11-01',
    aggravatingPatterns: [],
    startedInTraining: true,
    note: PAIN_NARRATIVE,
    redFlags: {},
    route: 'routine',
    caseId: c.id,
  });
  await ds
    .getRepository(CheckIn)
    .save({ organizationId: o.id, athleteId: a, date: '2026-11-20', sleepHours: 7.5, soreness: 2, readiness: 4, painNow: 2 });
  const log = await ds.getRepository(TrainingLog).save({
    organizationId: o.id,
    athleteId: a,
    date: '2026-11-30',
    durationMinutes: 60,
    sessionRpe: 6,
    painBefore: 0,
    painDuring: 1,
    painNextMorning: null,
    painCeiling: 3,
    sets: [{ exercise: 'Back squat', loadKg: 60, reps: 5 }],
    notes: 'felt fine',
  });
  // Another athlete's log in the same organization: it must never leave in this record.
  await ds.getRepository(TrainingLog).save({ ...log, id: undefined, athleteId: o.otherAthlete.membershipId, notes: OTHER_PERSON });
  const storage = createStorage(config);
  await storage.put(`test-record/${c.id}/doc`, Readable.from(PDF), { size: PDF.length, contentType: 'application/pdf' });
  await ds.getRepository(CaseDocument).save({
    organizationId: o.id,
    athleteId: a,
    caseId: c.id,
    title: 'MRI report',
    documentDate: '2026-11-05',
    issuedBy: 'Imaging centre',
    mediaType: 'application/pdf',
    sizeBytes: String(PDF.length),
    sha256: 'a'.repeat(64),
    storageKey: `test-record/${c.id}/doc`,
    uploadedByUserId: o.athlete.userId,
    uploadedByName: o.athlete.name,
  });
  const video = webm(2000);
  await storage.put(`test-record/${c.id}/clip`, Readable.from(video), { size: video.length, contentType: 'video/webm' });
  await ds.getRepository(Clip).save({
    organizationId: o.id,
    athleteId: a,
    trainingLogId: log.id,
    exercise: 'Back squat',
    caption: 'top set',
    mediaType: 'video/webm',
    sizeBytes: String(video.length),
    sha256: 'b'.repeat(64),
    storageKey: `test-record/${c.id}/clip`,
    uploadedByUserId: o.athlete.userId,
    uploadedByName: o.athlete.name,
  });
  return { caseId: c.id, video };
}
