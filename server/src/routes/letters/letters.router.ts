import { z } from 'zod';
import {
  CheckCodeSchema,
  LetterCreateSchema,
  LetterSignSchema,
  LetterUpdateSchema,
  NothingSchema,
  OrgItemParamsSchema,
  OrgParamsSchema,
  UuidSchema,
} from '../../../../policies/schemas';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import { acknowledgeLetter, downloadLetter, draftLetter, editLetter, signLetter } from '../../commands/letters';
import { AppError } from '../../core/errors';
import type { Deps } from '../../http/context';
import { sendPdf } from '../../http/downloads';
import { orgRoute, publicRoute, type RouteDef } from '../../http/route';
import { limitStore } from '../../http/security';
import { letterCheckQuery, letterPrefill, letterPreview, letters } from '../../queries/letters';
import { deliveries, outboxMessages } from '../../queries/outbox';

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
  return [
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/letters',
      summary: 'Clearance letters I may see (delivery status for clinicians and admins)',
      access: { kind: 'org', action: 'read', subject: 'Letter' },
      params: OrgParamsSchema,
      body: NothingSchema,
      query: z.strictObject({ athleteId: UuidSchema.optional() }),
      handler: ({ read, query }) => read(letters, query),
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/letters/prefill',
      summary: "The updated letter's form, filled in from the status and limits in force today",
      access: { kind: 'org', action: 'create', subject: 'Letter' },
      params: OrgParamsSchema,
      body: NothingSchema,
      query: z.strictObject({ athleteId: UuidSchema }),
      handler: ({ read, query }) => read(letterPrefill, query),
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/letters',
      summary: 'Draft a clearance letter (limits in force are filled in for a limited decision)',
      access: { kind: 'org', action: 'create', subject: 'Letter' },
      params: OrgParamsSchema,
      query: NothingSchema,
      body: LetterCreateSchema,
      command: draftLetter,
      status: 201,
      handler: ({ run, body }) => run(draftLetter, body),
    }),
    orgRoute({
      method: 'patch',
      path: '/orgs/:orgId/letters/:id',
      summary: 'Edit a draft letter (a signed letter is frozen)',
      access: { kind: 'org', action: 'update', subject: 'Letter' },
      params: OrgItemParamsSchema,
      query: NothingSchema,
      body: LetterUpdateSchema,
      command: editLetter,
      handler: ({ run, params, body }) => run(editLetter, { id: params.id, ...body }),
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/letters/:id/preview',
      summary: 'The draft as a PDF, marked DRAFT (no code)',
      access: { kind: 'org', action: 'update', subject: 'Letter' },
      params: OrgItemParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      async handler({ read, params, res }) {
        const { pdf, filename } = await read(letterPreview, { id: params.id });
        sendPdf(res, pdf, filename);
        return pdf;
      },
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/letters/:id/sign',
      summary: 'Sign: freeze the letter, make its PDF and code, supersede the previous letter, and send it',
      access: { kind: 'org', action: 'update', subject: 'Letter' },
      params: OrgItemParamsSchema,
      query: NothingSchema,
      body: LetterSignSchema,
      command: signLetter,
      handler: ({ run, params, body }) => run(signLetter, { id: params.id, ...body }),
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/letters/:id/pdf',
      summary: 'Download a signed letter (attachment, never cached; the download is audited)',
      access: { kind: 'org', action: 'read', subject: 'Letter' },
      params: OrgItemParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      command: downloadLetter,
      async handler({ run, params, res }) {
        const { pdf, filename } = await run(downloadLetter, { id: params.id });
        sendPdf(res, pdf, filename);
        return pdf;
      },
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/letters/:id/acknowledge',
      summary: 'A guardian acknowledges a letter (time-stamped and audited)',
      access: { kind: 'org', action: 'create', subject: 'LetterAcknowledgement' },
      params: OrgItemParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      command: acknowledgeLetter,
      handler: ({ run, params }) => run(acknowledgeLetter, { id: params.id }),
    }),
    publicRoute({
      method: 'post',
      path: '/check',
      summary: 'Public letter check: valid, scheduled, expired, superseded or unknown, with dates and decision only (rate-limited)',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      before: [checkLimit],
      body: CheckCodeSchema,
      writesNothing: 'a POST only so the code travels in the body, never in a URL',
      handler: ({ readPublic, body }) => readPublic(letterCheckQuery, body.code),
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/outbox',
      summary: "The local fake mail server's messages (admins; only while the fake is in use)",
      access: { kind: 'org', action: 'read', subject: 'Outbox' },
      params: OrgParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      handler: ({ read }) => read(outboxMessages, undefined),
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/deliveries',
      summary: "The organization's outgoing e-mail and its delivery state (queued, sending, sent, failed with the reason)",
      access: { kind: 'org', action: 'read', subject: 'Outbox' },
      params: OrgParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      handler: ({ read }) => read(deliveries, undefined),
    }),
  ];
}
