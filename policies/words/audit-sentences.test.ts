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
    expect(auditSentence({ action: 'auth.sign_in_limited', actorName: null, athleteName: null, subjectType: 'User' })).toBe(
      'Sign-in attempts for Loadline were paused after too many tries.',
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

  it('every sentence is a sentence: capital first, no code, no ISO date', () => {
    for (const action of Object.keys(AUDIT_SENTENCES)) {
      const s = auditSentence({ action, actorName: 'Priya Raman', athleteName: 'Maya Torres', subjectType: 'Case', after: { version: 2 } });
      expect(s, action).toMatch(/^[A-Z].*\.$/);
      expect(s, action).not.toContain(action);
      expect(s, action).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    }
  });
});
