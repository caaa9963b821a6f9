import { createHash } from 'node:crypto';
import { z } from 'zod';
import type { DeliveryDto, LetterCheckDto, OutboxMessageDto } from '../../../../policies/dto';
import {
  CheckCodeSchema,
  LetterCreateSchema,
  LetterSignSchema,
  LetterUpdateSchema,
  OrgItemParamsSchema,
  OrgParamsSchema,
  UuidSchema,
} from '../../../../policies/schemas';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import { limitStore } from '../../http/security';
import { ClearanceLetter, LetterAcknowledgement, Organization } from '../../entities';
import { renderLetterPdf, decisionWords, type LetterData } from '../../../../templates/letter/clearance-letter';
import { emails } from '../../../../templates/email/messages';
import { authorize } from '../../core/authorize';
import { AppError } from '../../core/errors';
import type { Deps } from '../../http/context';
import { orgRoute, publicRoute, type RouteDef } from '../../http/route';
import { enqueueEmail } from '../../mail/deliveries';
import { athleteCircle } from '../../services/notify';
import {
  hashCode,
  initials,
  limitsInForce,
  listLetters,
  newVerificationCode,
  signedLetterDates,
  standingToday,
} from '../../services/letters';
import { updateVersioned } from '../../services/versioned';

function sendPdf(res: import('express').Response, pdf: Buffer, filename: string) {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
  res.setHeader('Cache-Control', 'no-store');
  res.status(200).send(pdf);
}

async function athleteName(db: { query: (q: string, p: unknown[]) => Promise<{ name: string }[]> }, id: string) {
  return (
    (await db.query(`SELECT u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.id = $1`, [id]))[0]?.name ??
    ''
  );
}

export function letterRoutes(deps: Deps): RouteDef[] {
  const checkLimit = rateLimit({
    windowMs: 60_000,
    store: limitStore(deps, 'letter-check'),
    limit: 30,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `check:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    handler: (_req, _res, next) => next(new AppError('rate_limited', 'Too many checks from this address. Wait a minute and try again.')),
  });
  const publicBase = (req: import('express').Request) => deps.config.PUBLIC_URL ?? `${req.protocol}://${req.get('host')}`;
  return [
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/letters',
      summary: 'Clearance letters I may see (delivery status for clinicians and admins)',
      access: { kind: 'org', action: 'read', subject: 'Letter' },
      params: OrgParamsSchema,
      query: z.strictObject({ athleteId: UuidSchema.optional() }),
      async handler({ ds, ability, actor, query }) {
        return listLetters(ds, ability, actor.organizationId, query);
      },
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/letters',
      summary: 'Draft a clearance letter (limits in force are filled in for a limited decision)',
      access: { kind: 'org', action: 'create', subject: 'Letter' },
      params: OrgParamsSchema,
      body: LetterCreateSchema,
      status: 201,
      async handler({ ds, ability, actor, user, body, tx }) {
        authorize(ability, 'create', 'Letter', { id: '', organizationId: actor.organizationId, athleteId: body.athleteId });
        const id = await tx(async (m, audit) => {
          const limits = body.decision === 'full' ? [] : (body.limits ?? (await limitsInForce(m, body.athleteId, body.effectiveFrom)));
          const saved = await m.save(
            m.create(ClearanceLetter, {
              organizationId: actor.organizationId,
              athleteId: body.athleteId,
              decision: body.decision,
              effectiveFrom: body.effectiveFrom,
              validUntil: body.validUntil ?? null,
              limits,
              clinicianName: user.displayName,
              credential: body.credential,
              licenceNumber: body.licenceNumber,
              familyNote: body.familyNote,
              status: 'draft',
              createdBy: user.id,
            }),
          );
          await audit({
            action: 'letter.drafted',
            subjectType: 'Letter',
            subjectId: saved.id,
            athleteId: body.athleteId,
            after: { ...body, limits },
          });
          return saved.id;
        });
        return (await listLetters(ds, ability, actor.organizationId, { id }))[0];
      },
    }),
    orgRoute({
      method: 'patch',
      path: '/orgs/:orgId/letters/:id',
      summary: 'Edit a draft letter (a signed letter is frozen)',
      access: { kind: 'org', action: 'update', subject: 'Letter' },
      params: OrgItemParamsSchema,
      body: LetterUpdateSchema,
      async handler({ ds, ability, actor, params, body, tx }) {
        const { version, ...changes } = body;
        await tx(async (m, audit) => {
          const l = await m.findOne(ClearanceLetter, { where: { id: params.id, organizationId: actor.organizationId } });
          authorize(ability, 'update', 'Letter', l);
          if (l.status !== 'draft')
            throw new AppError('conflict', 'This letter is signed and frozen. Issue a new letter instead; it will supersede this one.');
          await updateVersioned(m, ClearanceLetter, l.id, version, { ...changes, updatedAt: () => 'now()' }, 'letter');
          await audit({ action: 'letter.edited', subjectType: 'Letter', subjectId: l.id, athleteId: l.athleteId, after: changes });
        });
        return (await listLetters(ds, ability, actor.organizationId, { id: params.id }))[0];
      },
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/letters/:id/preview',
      summary: 'The draft as a PDF, marked DRAFT (no code)',
      access: { kind: 'org', action: 'update', subject: 'Letter' },
      params: OrgItemParamsSchema,
      async handler({ ds, ability, actor, params, res }) {
        const l = await ds.getRepository(ClearanceLetter).findOne({ where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'update', 'Letter', l);
        const org = await ds.getRepository(Organization).findOneByOrFail({ id: actor.organizationId });
        const pdf = await renderLetterPdf({
          ...letterData(l, org.name, await athleteName(ds, l.athleteId)),
          draft: true,
          verificationCode: '',
          checkUrl: '',
          signature: '',
          signedAt: new Date().toISOString(),
        });
        sendPdf(res, pdf, `draft-letter-${l.effectiveFrom}.pdf`);
        return pdf;
      },
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/letters/:id/sign',
      summary: 'Sign: freeze the letter, make its PDF and code, supersede the previous letter, and send it',
      access: { kind: 'org', action: 'update', subject: 'Letter' },
      params: OrgItemParamsSchema,
      body: LetterSignSchema,
      async handler({ ds, ability, actor, user, params, body, req, tx }) {
        const code = newVerificationCode();
        const result = await tx(async (m, audit) => {
          const l = await m.findOne(ClearanceLetter, { where: { id: params.id, organizationId: actor.organizationId } });
          authorize(ability, 'update', 'Letter', l);
          if (l.status !== 'draft') throw new AppError('conflict', 'This letter is already signed.');
          if (l.version !== body.version)
            throw new AppError('version_conflict', 'Someone changed this letter after you opened it. Reload it, check it, then sign.');
          const org = await m.findOneByOrFail(Organization, { id: actor.organizationId });
          const name = await athleteName(m, l.athleteId);
          const signedAt = new Date();
          const checkUrl = `${publicBase(req)}/check/${code}`;
          const pdf = await renderLetterPdf({
            ...letterData(l, org.name, name),
            signature: body.signature,
            signedAt: signedAt.toISOString(),
            verificationCode: code,
            checkUrl,
          });
          const sha = createHash('sha256').update(pdf).digest('hex');
          await updateVersioned(
            m,
            ClearanceLetter,
            l.id,
            body.version,
            {
              status: 'signed',
              signature: body.signature,
              signedAt,
              codeHash: hashCode(code),
              pdf,
              pdfSha256: sha,
              clinicianName: user.displayName,
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
          await audit({
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
          const recipients: { id: string; email: string; name: string }[] = await m.query(
            `SELECT m.id, u.email, u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.id = ANY($1)`,
            [[...new Set([...circle.guardians, l.athleteId, ...circle.coaches])]],
          );
          for (const r of recipients) {
            await enqueueEmail(m, deps.jobs, {
              organizationId: actor.organizationId,
              kind: 'letter',
              to: r.email,
              recipientId: r.id,
              letterId: l.id,
              content: emails.letter({
                name: r.name,
                athleteName: name,
                decision: decisionWords(l),
                organizationName: org.name,
                url: `${publicBase(req)}/`,
              }),
            });
          }
          return { athleteId: l.athleteId };
        });
        const [dto] = await listLetters(ds, ability, actor.organizationId, { id: params.id });
        return { ...dto, verificationCode: code, athleteId: result.athleteId };
      },
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/letters/:id/pdf',
      summary: 'Download a signed letter (attachment, never cached; the download is audited)',
      access: { kind: 'org', action: 'read', subject: 'Letter' },
      params: OrgItemParamsSchema,
      async handler({ ds, ability, actor, params, res, tx }) {
        const l = await ds
          .getRepository(ClearanceLetter)
          .createQueryBuilder('l')
          .addSelect('l.pdf')
          .where('l.id = :id AND l.organization_id = :org', { id: params.id, org: actor.organizationId })
          .getOne();
        authorize(ability, 'read', 'Letter', l, 'content');
        if (!l.pdf) throw new AppError('not_found', 'This letter is not signed yet, so it has no PDF. Use the preview.');
        await tx((_m, audit) => audit({ action: 'letter.downloaded', subjectType: 'Letter', subjectId: l.id, athleteId: l.athleteId }));
        sendPdf(res, l.pdf, `clearance-letter-${l.effectiveFrom}.pdf`);
        return l.pdf;
      },
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/letters/:id/acknowledge',
      summary: 'A guardian acknowledges a letter (time-stamped and audited)',
      access: { kind: 'org', action: 'create', subject: 'LetterAcknowledgement' },
      params: OrgItemParamsSchema,
      async handler({ ds, ability, actor, params, tx }) {
        await tx(async (m, audit) => {
          const l = await m.findOne(ClearanceLetter, { where: { id: params.id, organizationId: actor.organizationId } });
          authorize(ability, 'read', 'Letter', l, 'content');
          authorize(ability, 'create', 'LetterAcknowledgement', { organizationId: l.organizationId, athleteId: l.athleteId });
          if (l.status === 'draft') throw new AppError('not_found', 'That letter was not found.');
          const inserted = await m
            .createQueryBuilder()
            .insert()
            .into(LetterAcknowledgement)
            .values({ letterId: l.id, guardianId: actor.membershipId })
            .orIgnore()
            .execute();
          if ((inserted.raw as unknown[]).length)
            await audit({ action: 'letter.acknowledged', subjectType: 'Letter', subjectId: l.id, athleteId: l.athleteId });
        });
        return (await listLetters(ds, ability, actor.organizationId, { id: params.id }))[0];
      },
    }),
    publicRoute({
      method: 'post',
      path: '/check',
      summary: 'Public letter check: valid, scheduled, expired, superseded or unknown, with dates and decision only (rate-limited)',
      access: { kind: 'public' },
      before: [checkLimit],
      body: CheckCodeSchema,
      async handler({ ds, body }) {
        const rows: {
          id: string;
          athlete_id: string;
          decision: 'full' | 'limited';
          effective_from: string;
          valid_until: string | null;
          signed_at: Date;
          org: string;
          name: string;
        }[] = await ds.query(
          `SELECT l.id, l.athlete_id, l.decision, l.effective_from, l.valid_until, l.signed_at, o.name AS org, u.display_name AS name
             FROM clearance_letters l JOIN organizations o ON o.id = l.organization_id
             JOIN memberships m ON m.id = l.athlete_id JOIN users u ON u.id = m.user_id
            WHERE l.code_hash = $1 AND l.status <> 'draft'`,
          [hashCode(body.code)],
        );
        const r = rows[0];
        if (!r) return { status: 'unknown' } satisfies LetterCheckDto;
        const standing = standingToday({ id: r.id, athleteId: r.athlete_id }, await signedLetterDates(ds, [r.athlete_id]));
        const dto: LetterCheckDto = {
          status: standing.status === 'signed' ? 'valid' : standing.status,
          athleteInitials: initials(r.name),
          decision: decisionWords({ decision: r.decision, effectiveFrom: r.effective_from }),
          effectiveFrom: r.effective_from,
          validUntil: r.valid_until,
          organizationName: r.org,
          issuedOn: new Date(r.signed_at).toISOString().slice(0, 10),
        };
        return dto;
      },
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/outbox',
      summary: "The local fake mail server's messages (admins; only while the fake is in use)",
      access: { kind: 'org', action: 'read', subject: 'Outbox' },
      params: OrgParamsSchema,
      async handler({ ds, actor }) {
        if (deps.config.FAKE_MAIL !== 'true')
          throw new AppError('not_found', 'The outbox exists only while the local fake mail server is in use.');
        // The mailbox is shared by every organization: only messages of this organization's deliveries
        // (matched by the Message-ID deliver() sets) are listed (SECURITY item 15).
        const rows: {
          id: string;
          received_at: Date;
          envelope_to: string[];
          subject: string | null;
          text_body: string | null;
          attachments: OutboxMessageDto['attachments'];
        }[] = await ds.query(
          `SELECT f.id, f.received_at, f.envelope_to, f.subject, f.text_body, f.attachments FROM fake_mailbox f
              WHERE EXISTS (SELECT 1 FROM email_deliveries d WHERE d.organization_id = $1 AND f.message_id = '<' || d.id || '@loadline.invalid>')
              ORDER BY f.id DESC LIMIT 200`,
          [actor.organizationId],
        );
        return rows.map((r): OutboxMessageDto => ({
          id: String(r.id),
          receivedAt: new Date(r.received_at).toISOString(),
          to: r.envelope_to,
          subject: r.subject,
          text: r.text_body,
          attachments: r.attachments,
        }));
      },
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/deliveries',
      summary: "The organization's outgoing e-mail and its delivery state (queued, sending, sent, failed with the reason)",
      access: { kind: 'org', action: 'read', subject: 'Outbox' },
      params: OrgParamsSchema,
      async handler({ ds, actor }) {
        const rows: {
          id: string;
          kind: string;
          to_address: string;
          subject: string;
          status: DeliveryDto['status'];
          attempts: number;
          last_error: string | null;
          created_at: Date;
          sent_at: Date | null;
        }[] = await ds.query(
          `SELECT id, kind, to_address, subject, status, attempts, last_error, created_at, sent_at FROM email_deliveries
              WHERE organization_id = $1 ORDER BY created_at DESC LIMIT 300`,
          [actor.organizationId],
        );
        return rows.map((r): DeliveryDto => ({
          id: r.id,
          kind: r.kind,
          to: r.to_address,
          subject: r.subject,
          status: r.status,
          attempts: r.attempts,
          lastError: r.last_error,
          createdAt: new Date(r.created_at).toISOString(),
          sentAt: r.sent_at ? new Date(r.sent_at).toISOString() : null,
        }));
      },
    }),
  ];
}

function letterData(
  l: ClearanceLetter,
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
