import { describe, expect, it } from 'vitest';
import {
  CLINICIAN_RECORD_CAUTION,
  EXCEPTION_DECISION_CAUTION,
  PAIN_CEILING_CAUTION,
  PROGRAM_CAUTION,
  STANDING_CAUTION,
  TEAM_RECORD_CAUTION,
} from './cautions';

// Source for every check: shared/PRODUCT.md, "Cautions the product must show (in its own words)" and
// "Principles: Safety defers to licensed care ... Cautions are short and never hidden behind a click".

const ACTION_CAUTIONS = { program: PROGRAM_CAUTION, exception: EXCEPTION_DECISION_CAUTION };

describe('the cautions, in the product brief’s words (shared/PRODUCT.md, cautions)', () => {
  it.each(Object.entries(ACTION_CAUTIONS))(
    'the %s caution says Loadline does not diagnose, treat or replace professional care',
    (_n, c) => {
      expect(c.text).toContain('does not diagnose, treat or replace professional care');
    },
  );

  it.each(Object.entries(ACTION_CAUTIONS))('the %s caution is short: one lead and at most three sentences', (_n, c) => {
    expect(`${c.lead} ${c.text}`.length).toBeLessThanOrEqual(260);
    expect(c.text.split(/(?<=\.)\s/).length).toBeLessThanOrEqual(3);
  });

  it('the program builder tells the coach whose limits these are and to stop at the pain ceiling', () => {
    expect(PROGRAM_CAUTION.lead).toMatch(/clinician/);
    expect(PROGRAM_CAUTION.text).toMatch(/pain rises past the ceiling the clinician set, stop the session and tell the clinician/);
  });

  it('the exception decision is the clinician’s own, recorded, under local law and the organization’s policies', () => {
    expect(EXCEPTION_DECISION_CAUTION.lead).toMatch(/Your clinical decision/);
    expect(EXCEPTION_DECISION_CAUTION.text).toMatch(/records your decision and note/);
    expect(EXCEPTION_DECISION_CAUTION.text).toContain("Follow local law, your governing body's rules and your organization's policies.");
  });

  it('the standing, record and pain-ceiling cautions keep their words', () => {
    expect(STANDING_CAUTION).toMatch(
      /^Loadline keeps a record of decisions made by the athlete's licensed clinician\. It does not diagnose or treat/,
    );
    expect(CLINICIAN_RECORD_CAUTION.text).toBe(TEAM_RECORD_CAUTION.text);
    expect(CLINICIAN_RECORD_CAUTION.lead).not.toBe(TEAM_RECORD_CAUTION.lead);
    expect(PAIN_CEILING_CAUTION).toMatch(/stop and tell your clinician if pain climbs past the ceiling/);
  });
});
