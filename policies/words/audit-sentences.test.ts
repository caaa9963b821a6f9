import { describe, expect, it } from 'vitest';
import { AUDIT_SENTENCES, auditSentence } from './audit-sentences';

describe('audit trail sentences (ASVS 5.0 V16.2.1: entries people can read)', () => {
  it('reads a plan change as a sentence with the actor, the athlete and the version', () => {
    expect(
      auditSentence({
        action: 'plan.revised',
        actorName: 'Priya Raman',
        athleteName: 'Maya Torres',
        subjectType: 'RestrictionPlan',
        before: { version: 2 },
        after: { version: 3 },
      }),
    ).toBe("Priya Raman changed Maya Torres's plan (version 3).");
  });

  it('names the new participation status', () => {
    expect(
      auditSentence({
        action: 'status.changed',
        actorName: 'Priya Raman',
        athleteName: 'Maya Torres',
        subjectType: 'Case',
        after: { status: 'limited' },
      }),
    ).toBe("Priya Raman changed Maya Torres's participation status to Limited.");
  });

  it('names Loadline for entries without a person, and never shows a bare code for an unknown action', () => {
    expect(auditSentence({ action: 'team.recheck', actorName: null, athleteName: null, subjectType: 'Route' })).toMatch(/^Loadline /);
    expect(auditSentence({ action: 'auth.sign_in_limited', actorName: null, athleteName: null, subjectType: 'Route' })).toBe(
      'Sign-in attempts from one network address were paused after too many tries.',
    );
    const unknown = auditSentence({
      action: 'widget.frobbed',
      actorName: 'Ana Ruiz',
      athleteName: 'Maya Torres',
      subjectType: 'TrainingLog',
    });
    expect(unknown).toBe("Ana Ruiz made a change to Maya Torres's training log.");
    expect(unknown).not.toContain('widget.frobbed');
  });

  it('a failed or paused sign-in names the e-mail that was tried, never "Loadline" as if it had signed in (ASVS 5.0 V16.3.1)', () => {
    const failed = (after: object) =>
      auditSentence({ action: 'auth.sign_in_failed', actorName: null, athleteName: null, subjectType: 'User', after });
    expect(failed({ email: 'maya@example.org' })).toBe('A sign-in as maya@example.org failed.');
    expect(failed({ email: 'maya@example.org', step: 'second' })).toBe(
      'A sign-in as maya@example.org failed at the second step (the code was wrong or used).',
    );
    expect(
      auditSentence({
        action: 'auth.sign_in_limited',
        actorName: null,
        athleteName: null,
        subjectType: 'Route',
        after: { email: 'maya@example.org' },
      }),
    ).toBe('Sign-in attempts as maya@example.org were paused after too many tries.');
  });

  it('every sentence is a sentence: capital first, no code, no ISO date', () => {
    for (const action of Object.keys(AUDIT_SENTENCES)) {
      const s = auditSentence({ action, actorName: 'Priya Raman', athleteName: 'Maya Torres', subjectType: 'Case', after: { version: 2 } });
      expect(s, action).toMatch(/^[A-Z].*\.$/);
      expect(s, action).not.toContain(action);
      expect(s, action).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    }
  });
});
