import { describe, expect, it } from 'vitest';
import { auditSealEmails } from './audit-seal';
import { renderEmail } from './layout';

describe('audit seal e-mails render from their sample data', () => {
  it('the seal carries the seal line itself, so the mailbox keeps a copy (ASVS 5.0 V16.4.3)', () => {
    const { subject, text, html } = renderEmail(auditSealEmails.sealed());
    expect(subject).toBe('Audit seal for Sample Club, 2026-01-02');
    expect(text).toContain('Seal: {"v":1,"organizationId":"00000000-0000-0000-0000-000000000000","lastEntryId":"1042"}');
    expect(html).toContain('Seal: {&quot;v&quot;:1');
  });

  it('the refusal names the entry and the reason', () => {
    const { subject, text } = renderEmail(auditSealEmails.refused());
    expect(subject).toBe('Audit trail check failed for Sample Club');
    expect(text).toContain('at entry #1042: contents do not match the stored hash.');
  });
});
