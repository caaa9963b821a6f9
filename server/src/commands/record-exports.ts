import { asSubject } from '../../../policies/access';
import type { RecordExportDto } from '../../../policies/dto';
import type { RecordExportRequestInput } from '../../../policies/schemas';
import { humanDateTime } from '../../../policies/words/dates';
import { emails } from '../../../templates/email/messages';
import { Membership, RecordExport, User } from '../entities';
import { orgCommand, publicCommand } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { publicBaseUrl } from '../core/public-url';
import { enqueueEmail } from '../mail/deliveries';
import { memberName } from '../queries/members';
import { RECORD_LINK_DAYS, recordExportDto, recordExportSubject } from '../queries/record-export';
import { hashToken, newInvitationToken } from '../services/invitations';
import { slug } from '../services/uploads';

/** Copies one person may ask for in a day, whoever they are about (common practice: a few a day is plenty). */
export const RECORD_EXPORTS_PER_DAY = 3;

/**
 * Ask for a person's whole record. The athlete asks for their own; a guardian for a linked athlete
 * who is a minor on the organization's today. The row, its job and the audit entry commit together,
 * so a crash after the request still builds the copy (pg-boss keeps the job). A copy still being
 * prepared for the same person is answered again rather than started twice, and each person may
 * ask a few times a day (counted under a lock, so two quick clicks count as two).
 */
export const requestRecordExport = orgCommand<RecordExportRequestInput, RecordExportDto>({
  name: 'recordExports.request',
  async run(ctx, { athleteId }) {
    const { m, actor, ability } = ctx;
    const athlete = await m.findOne(Membership, { where: { id: athleteId, organizationId: actor.organizationId, active: true } });
    if (!athlete?.roles.includes('athlete')) throw new AppError('not_found', 'That athlete was not found.');
    const subject = await recordExportSubject(m, actor.organizationId, athleteId, ctx.today, ctx.userId);
    if (actor.guardianOf.includes(athleteId) && !subject.athleteIsMinor && athleteId !== actor.membershipId) {
      const name = await memberName(m, athleteId);
      throw new AppError('forbidden', `${name} is an adult now, so only ${name} can ask for a copy of their own record.`);
    }
    authorize(ability, 'create', 'RecordExport', subject);
    if (!ctx.deps.jobs)
      throw new AppError('unavailable', 'This server sends no e-mail, so it cannot send a copy of a record. Ask your organization.');

    await m.query('SELECT pg_advisory_xact_lock(hashtextextended($1, 0))', [`record-export:${ctx.userId}`]);
    const pending = await m.findOne(RecordExport, {
      where: { organizationId: actor.organizationId, athleteId, requestedBy: ctx.userId, status: 'queued' },
    });
    if (pending) return recordExportDto(m, pending, ctx.now);
    const [{ count }]: { count: number }[] = await m.query(
      `SELECT count(*)::int AS count FROM record_exports WHERE requested_by = $1 AND created_at > $2::timestamptz - interval '1 day'`,
      [ctx.userId, ctx.now.toISOString()],
    );
    if (count >= RECORD_EXPORTS_PER_DAY) {
      throw new AppError(
        'rate_limited',
        `You have asked for ${RECORD_EXPORTS_PER_DAY} copies in the last day. Use the link already e-mailed, or ask again tomorrow.`,
      );
    }
    const row = await m.save(
      m.create(RecordExport, { organizationId: actor.organizationId, athleteId, requestedBy: ctx.userId, status: 'queued' }),
    );
    await ctx.audit({ action: 'record_export.requested', subjectType: 'RecordExport', subjectId: row.id, athleteId });
    await ctx.deps.jobs.sendRecordExport(m, row.id);
    return recordExportDto(m, row, ctx.now);
  },
});

/** One message for a link that does not open, whatever the reason, so it tells its holder nothing. */
const linkUnknown = () =>
  new AppError('not_found', 'This download link does not work for your account. Sign in as the person who asked for the copy.');

/**
 * The download itself: the link's code, the person who asked (only they), still allowed to see the
 * record, and not expired. The first download is recorded on the request; every one is audited.
 */
export const downloadRecordExport = orgCommand<{ token: string }, { storageKey: string; filename: string; sizeBytes: number }>({
  name: 'recordExports.download',
  async run(ctx, { token }) {
    const { m, actor } = ctx;
    const r = await m
      .createQueryBuilder(RecordExport, 'r')
      .setLock('pessimistic_write')
      .where('r.token_hash = :hash AND r.organization_id = :org', { hash: hashToken(token), org: actor.organizationId })
      .getOne();
    if (!r || r.requestedBy !== ctx.userId || r.status !== 'ready') throw linkUnknown();
    const subject = await recordExportSubject(m, actor.organizationId, r.athleteId, ctx.today, r.requestedBy);
    if (!ctx.ability.can('read', asSubject('RecordExport', subject))) throw linkUnknown();
    if (r.expiresAt! <= ctx.now) {
      throw new AppError(
        'not_found',
        `This link expired on ${humanDateTime(r.expiresAt!, actor.timeZone)}. Ask for a new copy on your account page.`,
      );
    }
    // Swept copies (services/record-export-job.ts) are past their expiry, so this only guards a race.
    if (!r.storageKey) throw linkUnknown();
    if (!r.downloadedAt) await m.update(RecordExport, { id: r.id }, { downloadedAt: ctx.now });
    await ctx.audit({ action: 'record_export.downloaded', subjectType: 'RecordExport', subjectId: r.id, athleteId: r.athleteId });
    const name = slug(await memberName(m, r.athleteId)) || 'athlete';
    return {
      storageKey: r.storageKey,
      filename: `loadline-record-${name}-${r.readyAt!.toISOString().slice(0, 10)}.zip`,
      sizeBytes: Number(r.sizeBytes),
    };
  },
});

/**
 * The job's last step: the stored copy is recorded, its link made and e-mailed, and the entry written,
 * in one transaction. Run by Loadline itself (no signed-in person), so the entry has no actor.
 */
export const finishRecordExport = publicCommand({
  name: 'recordExports.finish',
  async run(ctx, input: { id: string; storageKey: string; sizeBytes: number; sha256: string; organizationName: string; timeZone: string }) {
    const { m } = ctx;
    const r = await m.createQueryBuilder(RecordExport, 'r').setLock('pessimistic_write').where('r.id = :id', { id: input.id }).getOne();
    if (r?.status !== 'queued') return false;
    const user = await m.findOneByOrFail(User, { id: r.requestedBy });
    const { token, tokenHash } = newInvitationToken();
    const expiresAt = new Date(ctx.now.getTime() + RECORD_LINK_DAYS * 86_400_000);
    await m.update(
      RecordExport,
      { id: r.id },
      {
        status: 'ready',
        storageKey: input.storageKey,
        sizeBytes: String(input.sizeBytes),
        sha256: input.sha256,
        tokenHash,
        readyAt: ctx.now,
        expiresAt,
      },
    );
    // The code rides in the fragment, which browsers never send to a server or in a Referer.
    const link = `${publicBaseUrl(ctx.deps.config)}/record-download?org=${r.organizationId}#${token}`;
    await enqueueEmail(m, ctx.deps.jobs, {
      organizationId: r.organizationId,
      kind: 'record_export',
      to: user.email,
      content: emails.recordExport({
        name: user.displayName,
        athleteName: await memberName(m, r.athleteId),
        organizationName: input.organizationName,
        link,
        expiresOn: humanDateTime(expiresAt, input.timeZone),
      }),
    });
    await ctx.audit({
      action: 'record_export.ready',
      subjectType: 'RecordExport',
      subjectId: r.id,
      athleteId: r.athleteId,
      after: { sizeBytes: input.sizeBytes, sha256: input.sha256, expiresAt: expiresAt.toISOString() },
    });
    return true;
  },
});

/** The job gave up, or the person may no longer ask: the request says so, in a sentence, and the trail records it. */
export const failRecordExport = publicCommand({
  name: 'recordExports.fail',
  async run(ctx, input: { id: string; problem: string }) {
    const { m } = ctx;
    const r = await m.createQueryBuilder(RecordExport, 'r').setLock('pessimistic_write').where('r.id = :id', { id: input.id }).getOne();
    if (r?.status !== 'queued') return;
    await m.update(RecordExport, { id: r.id }, { status: 'failed', problem: input.problem });
    await ctx.audit({ action: 'record_export.failed', subjectType: 'RecordExport', subjectId: r.id, athleteId: r.athleteId });
  },
});
