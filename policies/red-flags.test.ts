import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { flaggedItems, RED_FLAG_ITEMS, routeReport, type RedFlagAnswers } from './red-flags';
import { PainReportCreateSchema } from './schemas/athlete';

const allNo = (): RedFlagAnswers => Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false]));
const only = (...ids: string[]): RedFlagAnswers => ({ ...allNo(), ...Object.fromEntries(ids.map((id) => [id, true])) });
const ids = (tier: 'emergency' | 'urgent') => RED_FLAG_ITEMS.filter((i) => i.tier === tier).map((i) => i.id);

describe('the red-flag items (NICE NG59 2016, updated 2020; Finucane et al. 2020, JOSPT 50:350–372)', () => {
  it('item ids are unique, so one answer can never stand for two questions', () => {
    const all = RED_FLAG_ITEMS.map((i) => i.id);
    expect(new Set(all).size).toBe(all.length);
  });

  it('every possible cauda equina sign is an emergency item (NICE NG59; Finucane et al. 2020)', () => {
    // Saddle numbness; bladder; bowel; sexual function; both legs; progressive weakness.
    expect(ids('emergency').sort()).toEqual([
      'bladder_change',
      'both_legs',
      'bowel_change',
      'leg_weakness_worsening',
      'saddle_numbness',
      'sexual_change',
    ]);
  });

  it('the urgent items cover cancer, weight loss, night pain, fever, immunity/steroids, trauma (NICE NG59; Finucane et al. 2020) and adolescent extension pain (from memory)', () => {
    expect(ids('urgent')).toEqual(
      expect.arrayContaining([
        'cancer_history',
        'weight_loss',
        'night_pain',
        'fever_unwell',
        'immune_steroids',
        'significant_trauma',
        'extension_pain_adolescent',
      ]),
    );
  });

  it('every item has a question to ask (common practice)', () => {
    for (const i of RED_FLAG_ITEMS) expect(i.question.trim().length, i.id).toBeGreaterThan(10);
  });
});

describe('routing a report (NICE NG59; Finucane et al. 2020)', () => {
  it.each(ids('emergency'))('%s alone → emergency (NICE NG59; Finucane et al. 2020)', (id) => {
    expect(routeReport(only(id))).toBe('emergency');
  });

  it.each(ids('urgent'))('%s alone → urgent (NICE NG59; Finucane et al. 2020)', (id) => {
    expect(routeReport(only(id))).toBe('urgent');
  });

  it('no flags → routine (NICE NG59: reassure, stay active)', () => {
    expect(routeReport(allNo())).toBe('routine');
    expect(routeReport({})).toBe('routine');
  });

  it('emergency beats urgent when both are answered yes (NICE NG59; Finucane et al. 2020)', () => {
    for (const e of ids('emergency')) for (const u of ids('urgent')) expect(routeReport(only(e, u))).toBe('emergency');
  });

  it('pain 8 with no flag is not an emergency: the route depends only on the answers (NICE NG59: no flag → clinician, not emergency)', () => {
    const report = PainReportCreateSchema.parse({
      athleteId: '33333333-3333-4333-8333-333333333333',
      bodyRegions: ['lower_back'],
      painNow: 8,
      painWorst24h: 10,
      onsetDate: '2026-01-05',
      startedInTraining: true,
      redFlags: allNo(),
    });
    expect(routeReport(report.redFlags)).toBe('routine');
  });

  it('property: any emergency item → emergency whatever the other answers (NICE NG59; Finucane et al. 2020)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...ids('emergency')),
        fc.array(fc.boolean(), { minLength: RED_FLAG_ITEMS.length, maxLength: RED_FLAG_ITEMS.length }),
        (id, bits) => {
          const answers = Object.fromEntries(RED_FLAG_ITEMS.map((i, k) => [i.id, bits[k]]));
          answers[id] = true;
          expect(routeReport(answers)).toBe('emergency');
        },
      ),
    );
  });

  it('only a real yes counts: a truthy non-boolean is not an answer (common practice; the schema refuses it anyway)', () => {
    expect(routeReport({ ...allNo(), saddle_numbness: 'yes' as unknown as boolean })).toBe('routine');
  });

  it('flaggedItems lists exactly the items answered yes, in screen order (common practice)', () => {
    expect(flaggedItems(only('night_pain', 'both_legs')).map((i) => i.id)).toEqual(['both_legs', 'night_pain']);
    expect(flaggedItems(allNo())).toEqual([]);
  });
});
