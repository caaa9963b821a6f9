/**
 * The daily audit seal (ASVS 5.0 V16.4.3): for each organization, check its chain against itself and
 * its earlier seals, then seal the head, append the seal to the organization's file, and e-mail it to
 * the organization's admins. A chain that fails the check is not sealed (a seal would anchor the
 * rewrite): the admins are told instead. Run by the pg-boss schedule and by `npm run audit:seal`.
 */
import type { DataSource } from 'typeorm';
import type { Logger } from 'pino';
import { auditSealEmails } from '../../../templates/email/audit-seal';
import { enqueueEmail } from '../mail/deliveries';
import type { JobQueue } from '../jobs/queue';
import { verifyChain } from './audit';
import { appendSeal, chainHead, checkSeals, readSeals, signSeal, type AuditSeal } from './audit-seal';

export interface SealDeps {
  ds: DataSource;
  key: string;
  dir: string;
  /** Where the e-mails go; null in a process that sends no mail (the seal is still written to the file). */
  queue: JobQueue | null;
  logger: Logger;
}

export type SealOutcome =
  | { organizationId: string; status: 'sealed'; seal: AuditSeal; file: string; emailed: number }
  | { organizationId: string; status: 'refused'; firstBrokenId: string | null; reason: string; emailed: number }
  | { organizationId: string; status: 'empty' };

interface Admin {
  membership_id: string;
  email: string;
  name: string;
}

async function adminsOf(ds: DataSource, organizationId: string): Promise<Admin[]> {
  return ds.query(
    `SELECT m.id AS membership_id, u.email, u.display_name AS name
       FROM memberships m JOIN users u ON u.id = m.user_id
      WHERE m.organization_id = $1 AND m.active AND 'admin' = ANY (m.roles)
      ORDER BY u.email`,
    [organizationId],
  );
}

export async function sealOrganization(deps: SealDeps, org: { id: string; name: string }): Promise<SealOutcome> {
  const { ds, key, dir, queue, logger } = deps;
  // The head first: everything up to it is then covered by the checks below.
  const head = await chainHead(ds.manager, org.id);
  if (!head) return { organizationId: org.id, status: 'empty' };
  const chain = await verifyChain(ds.manager, org.id);
  const seals = chain.intact ? await checkSeals(ds.manager, org.id, key, await readSeals(dir, org.id)) : null;
  const admins = await adminsOf(ds, org.id);
  const mail = async (content: (a: Admin) => Parameters<typeof enqueueEmail>[2]['content']) => {
    await ds.transaction(async (m) => {
      for (const a of admins) {
        await enqueueEmail(m, queue, {
          organizationId: org.id,
          kind: 'audit_seal',
          to: a.email,
          recipientId: a.membership_id,
          content: content(a),
        });
      }
    });
    return queue ? admins.length : 0;
  };

  const failed = !chain.intact ? chain : seals && !seals.intact ? seals : null;
  if (failed) {
    const reason = failed.reason ?? 'unknown';
    logger.error({ organizationId: org.id, firstBrokenId: failed.firstBrokenId, reason }, 'audit trail check failed: not sealed');
    const emailed = await mail((a) =>
      auditSealEmails.refused({ name: a.name, organizationName: org.name, firstBrokenId: failed.firstBrokenId, reason }),
    );
    return { organizationId: org.id, status: 'refused', firstBrokenId: failed.firstBrokenId, reason, emailed };
  }

  const seal = signSeal(key, head);
  const file = await appendSeal(dir, seal);
  const sealLine = JSON.stringify(seal);
  const emailed = await mail((a) =>
    auditSealEmails.sealed({
      name: a.name,
      organizationName: org.name,
      entries: seal.entries,
      lastEntryId: seal.lastEntryId,
      sealedAt: seal.sealedAt,
      sealLine,
    }),
  );
  logger.info({ organizationId: org.id, lastEntryId: seal.lastEntryId, file, emailed }, 'audit trail sealed');
  return { organizationId: org.id, status: 'sealed', seal, file, emailed };
}

/** Seals every organization (or only those named), one after another. */
export async function sealAll(deps: SealDeps, organizationIds?: string[]): Promise<SealOutcome[]> {
  const orgs: { id: string; name: string }[] = await deps.ds.query(
    `SELECT id, name FROM organizations WHERE $1::uuid[] IS NULL OR id = ANY ($1::uuid[]) ORDER BY created_at, id`,
    [organizationIds ?? null],
  );
  const out: SealOutcome[] = [];
  for (const org of orgs) out.push(await sealOrganization(deps, org));
  return out;
}
