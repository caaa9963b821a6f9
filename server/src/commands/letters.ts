import { createHash } from 'node:crypto';
import type { LetterDto } from '../../../policies/dto';
import type { LetterCreateInput, LetterUpdateInput } from '../../../policies/schemas';
import { emails } from '../../../templates/email/messages';
import { decisionWords, renderLetterPdf } from '../../../templates/letter/clearance-letter';
import { ClearanceLetter, LetterAcknowledgement } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError } from '../core/errors';
import { publicBaseUrl } from '../core/public-url';
import { enqueueEmail } from '../mail/deliveries';
import { lettersFor } from '../queries/letters';
import { memberContacts, memberName } from '../queries/members';
import { basisOfLetter, letterLinesOn } from '../services/letter-staleness';
import { hashCode, letterPdfData, letterPrintContext, newVerificationCode } from '../services/letters';
import { athleteCircle } from '../services/notify';
import { updateVersioned } from '../services/versioned';

/** The letter as its writer now sees it, read in the command's own transaction. */
async function readBack(ctx: OrgCommandCtx, id: string): Promise<LetterDto> {
  const [dto] = await lettersFor(ctx.m, ctx.ability, ctx.actor.organizationId, ctx.today, { id });
  return dto;
}

/** A clinician's letter, loaded for a change they must be allowed to make (404 when hidden, 403 when only readable). */
async function letterToChange(ctx: OrgCommandCtx, id: string): Promise<ClearanceLetter> {
  const l = await ctx.m.findOne(ClearanceLetter, { where: { id, organizationId: ctx.actor.organizationId } });
  authorize(ctx.ability, 'update', 'Letter', l);
  return l;
}

/** A draft; for a limited decision without limits given, the limits in force on its start date, in the family's words and unit. */
export const draftLetter = orgCommand<LetterCreateInput, LetterDto>({
  name: 'letters.draft',
  async run(ctx, input) {
    const { m, actor } = ctx;
    authorize(ctx.ability, 'create', 'Letter', { id: '', organizationId: actor.organizationId, athleteId: input.athleteId });
    const limits = input.decision === 'full' ? [] : (input.limits ?? (await letterLinesOn(m, input.athleteId, input.effectiveFrom)));
    const saved = await m.save(
      m.create(ClearanceLetter, {
        organizationId: actor.organizationId,
        athleteId: input.athleteId,
        decision: input.decision,
        effectiveFrom: input.effectiveFrom,
        validUntil: input.validUntil ?? null,
        limits,
        clinicianName: await memberName(m, actor.membershipId, ''),
        credential: input.credential,
        licenceNumber: input.licenceNumber,
        familyNote: input.familyNote,
        status: 'draft',
        createdBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'letter.drafted',
      subjectType: 'Letter',
      subjectId: saved.id,
      athleteId: input.athleteId,
      after: { ...input, limits },
    });
    return readBack(ctx, saved.id);
  },
});

/** Edits a draft at the version its editor saw; a signed letter is frozen. */
export const editLetter = orgCommand<{ id: string } & LetterUpdateInput, LetterDto>({
  name: 'letters.edit',
  async run(ctx, { id, version, ...changes }) {
    const l = await letterToChange(ctx, id);
    if (l.status !== 'draft')
      throw new AppError('conflict', 'This letter is signed and frozen. Issue a new letter instead; it will supersede this one.');
    await updateVersioned(ctx.m, ClearanceLetter, l.id, version, { ...changes, updatedAt: () => 'now()' }, 'letter');
    await ctx.audit({ action: 'letter.edited', subjectType: 'Letter', subjectId: l.id, athleteId: l.athleteId, after: changes });
    return readBack(ctx, l.id);
  },
});

/**
 * Signs a draft: freezes it, renders its PDF once (stored with its SHA-256), keeps only the hash of
 * the verification code, records the status and limits it rests on (so a later change marks it out of
 * date), records that it replaces the athlete's earlier signed letters, and queues
 * the e-mails to the athlete, their guardians and coaches. All of it commits in this one transaction,
 * so the letter row and its e-mail jobs commit together or not at all (the transactional outbox).
 * Links in the PDF and the e-mails come from configuration, never from the request.
 */
export const signLetter = orgCommand<
  { id: string; signature: string; version: number },
  LetterDto & { verificationCode: string; athleteId: string }
>({
  name: 'letters.sign',
  async run(ctx, { id, signature, version }) {
    const { m, actor } = ctx;
    const l = await letterToChange(ctx, id);
    if (l.status !== 'draft') throw new AppError('conflict', 'This letter is already signed.');
    if (l.version !== version)
      throw new AppError('version_conflict', 'Someone changed this letter after you opened it. Reload it, check it, then sign.');
    const code = newVerificationCode();
    const base = publicBaseUrl(ctx.deps.config);
    // The letter names whoever signs it, also when another clinician of the team drafted it.
    const clinicianName = await memberName(m, actor.membershipId, '');
    const print = await letterPrintContext(m, actor.organizationId, l.athleteId, actor.membershipId);
    const athleteName = print.athleteName;
    const pdf = await renderLetterPdf({
      ...letterPdfData({ ...l, clinicianName }, print),
      signature,
      signedAt: ctx.now.toISOString(),
      verificationCode: code,
      checkUrl: `${base}/check/${code}`,
    });
    const sha = createHash('sha256').update(pdf).digest('hex');
    await updateVersioned(
      m,
      ClearanceLetter,
      l.id,
      version,
      {
        status: 'signed',
        signature,
        signedAt: ctx.now,
        codeHash: hashCode(code),
        pdf,
        pdfSha256: sha,
        clinicianName,
        limitsBasis: (await basisOfLetter(m, l, ctx.today)) as never,
        updatedAt: () => 'now()',
      },
      'letter',
    );
    // Records that this letter replaces every earlier signed one for the athlete. It takes over only on
    // its start date: until then the earlier letter is still the one in force (see standingToday).
    const superseded = await m
      .createQueryBuilder()
      .update(ClearanceLetter)
      .set({ status: 'superseded', supersededBy: l.id } as never)
      .where(`athlete_id = :a AND status = 'signed' AND id <> :id`, { a: l.athleteId, id: l.id })
      .returning('id')
      .execute();
    await ctx.audit({
      action: 'letter.signed',
      subjectType: 'Letter',
      subjectId: l.id,
      athleteId: l.athleteId,
      after: {
        decision: l.decision,
        effectiveFrom: l.effectiveFrom,
        validUntil: l.validUntil,
        pdfSha256: sha,
        supersedes: (superseded.raw as { id: string }[]).map((r) => r.id),
      },
    });
    const circle = await athleteCircle(m, l.athleteId);
    const recipientIds = [...new Set([...circle.guardians, l.athleteId, ...circle.coaches])];
    const contacts = await memberContacts(m, recipientIds);
    for (const recipientId of recipientIds) {
      const r = contacts.get(recipientId);
      if (!r) continue;
      await enqueueEmail(m, ctx.deps.jobs, {
        organizationId: actor.organizationId,
        kind: 'letter',
        to: r.email,
        recipientId: r.id,
        letterId: l.id,
        content: emails.letter({
          name: r.name,
          athleteName,
          decision: decisionWords(l),
          organizationName: actor.organizationName,
          url: `${base}/`,
        }),
      });
    }
    return { ...(await readBack(ctx, l.id)), verificationCode: code, athleteId: l.athleteId };
  },
});

/** The signed PDF as stored (never rendered again); each download is audited. */
export const downloadLetter = orgCommand<{ id: string }, { pdf: Buffer; filename: string }>({
  name: 'letters.download',
  async run(ctx, { id }) {
    const l = await ctx.m
      .getRepository(ClearanceLetter)
      .createQueryBuilder('l')
      .addSelect('l.pdf')
      .where('l.id = :id AND l.organization_id = :org', { id, org: ctx.actor.organizationId })
      .getOne();
    authorize(ctx.ability, 'read', 'Letter', l, 'content');
    if (!l.pdf) throw new AppError('not_found', 'This letter is not signed yet, so it has no PDF. Use the preview.');
    await ctx.audit({ action: 'letter.downloaded', subjectType: 'Letter', subjectId: l.id, athleteId: l.athleteId });
    return { pdf: l.pdf, filename: `clearance-letter-${l.effectiveFrom}.pdf` };
  },
});

/** A guardian acknowledges a signed letter: time-stamped and audited once, a second call adds nothing. */
export const acknowledgeLetter = orgCommand<{ id: string }, LetterDto>({
  name: 'letters.acknowledge',
  async run(ctx, { id }) {
    const { m, actor, ability } = ctx;
    const l = await m.findOne(ClearanceLetter, { where: { id, organizationId: actor.organizationId } });
    authorize(ability, 'read', 'Letter', l, 'content');
    authorize(ability, 'create', 'LetterAcknowledgement', { organizationId: l.organizationId, athleteId: l.athleteId });
    if (l.status === 'draft') throw new AppError('not_found', 'That letter was not found.');
    const inserted = await m
      .createQueryBuilder()
      .insert()
      .into(LetterAcknowledgement)
      .values({ letterId: l.id, guardianId: actor.membershipId, acknowledgedAt: ctx.now })
      .orIgnore()
      .execute();
    if ((inserted.raw as unknown[]).length)
      await ctx.audit({ action: 'letter.acknowledged', subjectType: 'Letter', subjectId: l.id, athleteId: l.athleteId });
    return readBack(ctx, l.id);
  },
});
