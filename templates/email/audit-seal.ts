import type { EmailContent } from './layout';

/**
 * The daily audit seal sent to an organization's admins: a short, plain message carrying the seal line
 * itself, so the mailbox keeps a copy of the chain's head that nobody with only database access can
 * change (ASVS 5.0 V16.4.3). Each has sample data so a test can render it.
 */
export const auditSealEmails = {
  sealed(
    d: { name: string; organizationName: string; entries: number; lastEntryId: string; sealedAt: string; sealLine: string } = {
      name: 'Sample',
      organizationName: 'Sample Club',
      entries: 42,
      lastEntryId: '1042',
      sealedAt: '2026-01-02T02:00:00.000Z',
      sealLine: '{"v":1,"organizationId":"00000000-0000-0000-0000-000000000000","lastEntryId":"1042"}',
    },
  ): EmailContent {
    return {
      subject: `Audit seal for ${d.organizationName}, ${d.sealedAt.slice(0, 10)}`,
      greeting: `Hello ${d.name},`,
      paragraphs: [
        `Loadline sealed ${d.organizationName}'s audit trail at ${d.sealedAt}: ${d.entries} entries, up to entry #${d.lastEntryId}.`,
        'Keep this e-mail. If the trail is ever questioned, this seal shows what it held today; an operator checks it with npm run audit:verify.',
        `Seal: ${d.sealLine}`,
        'No action is needed.',
      ],
    };
  },
  refused(
    d: { name: string; organizationName: string; firstBrokenId: string | null; reason: string } = {
      name: 'Sample',
      organizationName: 'Sample Club',
      firstBrokenId: '1042',
      reason: 'contents do not match the stored hash',
    },
  ): EmailContent {
    return {
      subject: `Audit trail check failed for ${d.organizationName}`,
      greeting: `Hello ${d.name},`,
      paragraphs: [
        `Loadline did not seal ${d.organizationName}'s audit trail today, because the trail no longer matches itself or an earlier seal` +
          (d.firstBrokenId ? ` at entry #${d.firstBrokenId}` : '') +
          `: ${d.reason}.`,
        'Someone may have changed the trail outside Loadline. Keep the earlier seal e-mails and ask your Loadline operator to investigate.',
      ],
    };
  },
};
