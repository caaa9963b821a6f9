import type { DataSource, EntityManager } from 'typeorm';
import { asSubject } from '../../../policies/access';
import type {
  AthleteProfileDto,
  AuditEntryDto,
  CaseDocumentDto,
  CaseDto,
  CheckInDto,
  ClipDto,
  LetterDto,
  PainReportDto,
  PlanDto,
  ProgramDto,
  RecordExportDto,
  RecordExportLinkDto,
  RecordExportsDto,
  StatusChangeDto,
  TrainingLogDto,
} from '../../../policies/dto';
import { isMinor } from '../../../policies/roles';
import { CaseDocument, CheckIn, ClearanceLetter, Clip, RecordExport, RestrictionPlan, TrainingLog } from '../entities';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery, type QueryCtx } from '../core/command';
import { hashToken } from '../services/invitations';
import { EXTENSIONS, slug } from '../services/uploads';
import { athleteProfile } from './athletes';
import { auditEntries, EXPORT_LIMIT } from './audit';
import { listCases, statusHistory } from './cases';
import { lettersFor } from './letters';
import { memberName } from './members';
import { listPrograms } from './programs';
import { planDto } from './plans';
import { listPainReports } from './reports';
import { toCheckInDto, toLogDto } from './training';
import { clipsFor, toDocumentDto } from './uploads';

type Db = DataSource | EntityManager;
const managerOf = (db: Db): EntityManager => ('manager' in db ? db.manager : db);

/** How long an e-mailed link works (common practice for a download link to personal data: days, not months). */
export const RECORD_LINK_DAYS = 7;

/** The athlete's date of birth, to tell whether a guardian may still ask (policies/roles.ts isMinor). */
export async function athleteIsMinor(db: Db, athleteId: string, today: string): Promise<boolean> {
  const [row]: { date_of_birth: string | null }[] = await db.query(`SELECT date_of_birth FROM athlete_profiles WHERE membership_id = $1`, [
    athleteId,
  ]);
  return isMinor(row?.date_of_birth ?? null, today);
}

/** The request as the subject the access rules judge: who it is about, a minor today or not, who asked. */
export async function recordExportSubject(db: Db, organizationId: string, athleteId: string, today: string, requestedByUserId?: string) {
  return { organizationId, athleteId, athleteIsMinor: await athleteIsMinor(db, athleteId, today), requestedByUserId };
}

/** Everything about one athlete that a reader may see, read with the reader's own rules. */
export interface RecordContents {
  athleteName: string;
  /** JSON files of the archive, by name. */
  data: {
    profile: AthleteProfileDto;
    cases: (CaseDto & { statusHistory?: StatusChangeDto[]; plan?: PlanDto })[];
    painReports: PainReportDto[];
    checkIns: CheckInDto[];
    trainingLogs: TrainingLogDto[];
    programs: ProgramDto[];
    letters: (LetterDto & { file: string | null })[];
    documents: (CaseDocumentDto & { file: string })[];
    clips: (ClipDto & { file: string })[];
    auditEntries: AuditEntryDto[];
  };
  /** Signed letters' PDFs, by their path in the archive. */
  letterPdfs: { path: string; pdf: Buffer }[];
  /** Stored files (documents, clips), by their path in the archive. */
  stored: { path: string; storageKey: string }[];
}

/**
 * A program as one athlete's record holds it: only that athlete's name and holds, even when the
 * program was written for several (no other person's data leaves in someone's record).
 */
function onlyFor(p: ProgramDto, athleteId: string): ProgramDto {
  const i = p.athleteIds.indexOf(athleteId);
  return {
    ...p,
    athleteIds: [athleteId],
    athleteNames: i >= 0 ? [p.athleteNames[i]] : [],
    sessions: p.sessions.map((s) => ({ ...s, holds: s.holds.filter((h) => h.athleteId === athleteId) })),
  };
}

/**
 * A person's whole record as its reader may see it. Every part goes through the same rules as the
 * screens (accessibleWhere, pickPermitted, authorize), with the reader's ability: an athlete gets
 * their own diagnosis but not the clinical notes; a guardian the status and the letters but no pain
 * narrative or documents. Lists have no paging limit here: the whole record, not the newest page.
 */
export async function recordContents(ctx: QueryCtx, athleteId: string): Promise<RecordContents> {
  const { db, ability, actor, today } = ctx;
  const org = actor.organizationId;
  const profile = await athleteProfile(db, ability, org, today, athleteId);

  const cases: RecordContents['data']['cases'] = [];
  for (const c of await listCases(db, ability, org, { athleteId, state: 'all' }, today)) {
    const statusSeen = ability.can('read', asSubject('ParticipationStatus', { organizationId: org, athleteId }));
    const plan = c.planId ? await managerOf(db).findOne(RestrictionPlan, { where: { id: c.planId, organizationId: org } }) : null;
    const planSeen = plan && ability.can('read', asSubject('RestrictionPlan', { id: plan.id, organizationId: org, athleteId }), 'current');
    cases.push({
      ...c,
      ...(statusSeen ? { statusHistory: await statusHistory(db, c.id) } : {}),
      ...(planSeen ? { plan: await planDto(db, ability, plan) } : {}),
    });
  }

  const painReports = await listPainReports(db, ability, org, { athleteId }, 100_000);

  const logAcl = accessibleWhere(ability, 'read', 'TrainingLog', {
    organizationId: 'l.organization_id',
    athleteId: 'l.athlete_id',
    id: 'l.id',
  });
  const trainingLogs = (
    await managerOf(db)
      .createQueryBuilder(TrainingLog, 'l')
      .where('l.organization_id = :org AND l.athlete_id = :athleteId', { org, athleteId })
      .andWhere(logAcl.sql, logAcl.params)
      .orderBy('l.date', 'DESC')
      .addOrderBy('l.created_at', 'DESC')
      .getMany()
  ).map(toLogDto);
  const checkAcl = accessibleWhere(ability, 'read', 'CheckIn', { organizationId: 'c.organization_id', athleteId: 'c.athlete_id' });
  const checkIns = (
    await managerOf(db)
      .createQueryBuilder(CheckIn, 'c')
      .where('c.organization_id = :org AND c.athlete_id = :athleteId', { org, athleteId })
      .andWhere(checkAcl.sql, checkAcl.params)
      .orderBy('c.date', 'DESC')
      .getMany()
  ).map(toCheckInDto);

  const programs = (await listPrograms.run(ctx, { athleteId })).map((p) => onlyFor(p, athleteId));

  const letterPdfs: RecordContents['letterPdfs'] = [];
  const letters: RecordContents['data']['letters'] = [];
  for (const l of await lettersFor(db, ability, org, today, { athleteId })) {
    let file: string | null = null;
    if (l.status !== 'draft') {
      const row = await managerOf(db)
        .getRepository(ClearanceLetter)
        .createQueryBuilder('l')
        .addSelect('l.pdf')
        .where('l.id = :id AND l.organization_id = :org', { id: l.id, org })
        .getOne();
      authorize(ability, 'read', 'Letter', row, 'content');
      if (row.pdf) {
        file = `letters/clearance-letter-${l.effectiveFrom}-${l.id.slice(0, 8)}.pdf`;
        letterPdfs.push({ path: file, pdf: row.pdf });
      }
    }
    letters.push({ ...l, file });
  }

  const stored: RecordContents['stored'] = [];
  const docAcl = accessibleWhere(ability, 'read', 'CaseDocument', {
    id: 'd.id',
    organizationId: 'd.organization_id',
    athleteId: 'd.athlete_id',
    uploadedByUserId: 'd.uploaded_by_user_id',
  });
  const documents = (
    await managerOf(db)
      .createQueryBuilder(CaseDocument, 'd')
      .where('d.organization_id = :org AND d.athlete_id = :athleteId', { org, athleteId })
      .andWhere(docAcl.sql, docAcl.params)
      .orderBy('d.document_date', 'DESC')
      .getMany()
  ).map((d) => {
    const file = `documents/${d.documentDate}-${slug(d.title) || 'document'}-${d.id.slice(0, 8)}.${EXTENSIONS[d.mediaType] ?? 'bin'}`;
    stored.push({ path: file, storageKey: d.storageKey });
    return { ...toDocumentDto(d), file };
  });

  const clipDtos = await clipsFor(db, ability, org, { athleteId });
  const clipRows = clipDtos.length
    ? await managerOf(db).findBy(
        Clip,
        clipDtos.map((c) => ({ id: c.id, organizationId: org })),
      )
    : [];
  const keys = new Map(clipRows.map((c) => [c.id, c.storageKey]));
  const clips = clipDtos.map((c) => {
    const file = `clips/${c.sessionDate}-${slug(c.exercise) || 'clip'}-${c.id.slice(0, 8)}.${EXTENSIONS[c.mediaType] ?? 'bin'}`;
    stored.push({ path: file, storageKey: keys.get(c.id)! });
    return { ...c, file };
  });

  // The trail about the athlete only where the reader's rules show it (today: nobody outside the care team).
  const trail = await auditEntries(db, ability, actor, { athleteId, limit: EXPORT_LIMIT }, EXPORT_LIMIT);

  return {
    athleteName: profile.displayName,
    data: { profile, cases, painReports, checkIns, trainingLogs, programs, letters, documents, clips, auditEntries: trail },
    letterPdfs,
    stored,
  };
}

function toDto(r: RecordExport, athleteName: string, now: Date): RecordExportDto {
  const expired = r.status === 'ready' && r.expiresAt !== null && r.expiresAt <= now;
  return {
    id: r.id,
    athleteId: r.athleteId,
    athleteName,
    state: r.status === 'queued' ? 'preparing' : expired ? 'expired' : r.status,
    requestedAt: r.createdAt.toISOString(),
    readyAt: r.readyAt?.toISOString() ?? null,
    expiresAt: r.expiresAt?.toISOString() ?? null,
    downloadedAt: r.downloadedAt?.toISOString() ?? null,
    sizeBytes: r.sizeBytes === null ? null : Number(r.sizeBytes),
    problem: r.problem,
  };
}

/** Whose record the reader may ask for (themself as an athlete; a guardian's linked minors), and the requests they made. */
export const recordExports = orgQuery<void, RecordExportsDto>({
  name: 'recordExports.list',
  async run({ db, ability, actor, userId, today, now }) {
    const org = actor.organizationId;
    const candidates = [...(actor.roles.includes('athlete') ? [actor.membershipId] : []), ...actor.guardianOf];
    const people: RecordExportsDto['people'] = [];
    for (const athleteId of candidates) {
      const subject = await recordExportSubject(db, org, athleteId, today);
      if (!ability.can('create', asSubject('RecordExport', subject))) continue;
      people.push({ athleteId, athleteName: await memberName(db, athleteId), self: athleteId === actor.membershipId });
    }
    const rows = await managerOf(db).find(RecordExport, {
      where: { organizationId: org, requestedBy: userId },
      order: { createdAt: 'DESC' },
      take: 20,
    });
    const requests: RecordExportDto[] = [];
    for (const r of rows) {
      const subject = await recordExportSubject(db, org, r.athleteId, today, r.requestedBy);
      if (!ability.can('read', asSubject('RecordExport', subject))) continue;
      requests.push(toDto(r, await memberName(db, r.athleteId), now));
    }
    return { people, requests };
  },
});

export async function recordExportDto(db: Db, r: RecordExport, now: Date): Promise<RecordExportDto> {
  return toDto(r, await memberName(db, r.athleteId), now);
}

/**
 * What an e-mailed link opens to, for its requester only: ready (with the size), expired (a clear
 * page, never the file), or unknown — a wrong code, someone else's link or a request they may no
 * longer read all read the same, so a link reveals nothing to anyone else.
 */
export const recordExportLink = orgQuery<{ token: string }, RecordExportLinkDto>({
  name: 'recordExports.link',
  async run({ db, ability, actor, userId, today, now }, { token }) {
    const r = await managerOf(db)
      .createQueryBuilder(RecordExport, 'r')
      .where('r.token_hash = :hash AND r.organization_id = :org', { hash: hashToken(token), org: actor.organizationId })
      .getOne();
    if (!r || r.requestedBy !== userId || r.status !== 'ready') return { state: 'unknown' };
    const subject = await recordExportSubject(db, actor.organizationId, r.athleteId, today, r.requestedBy);
    if (!ability.can('read', asSubject('RecordExport', subject))) return { state: 'unknown' };
    const athleteName = await memberName(db, r.athleteId);
    if (r.expiresAt! <= now) return { state: 'expired', athleteName, expiresAt: r.expiresAt!.toISOString() };
    return { state: 'ready', athleteName, expiresAt: r.expiresAt!.toISOString(), sizeBytes: Number(r.sizeBytes) };
  },
});
