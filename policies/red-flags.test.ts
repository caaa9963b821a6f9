import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { BODY_REGIONS, type BodyRegion } from './body-regions';
import {
  checkRedFlagAnswers,
  flaggedItems,
  noRedFlags,
  RED_FLAG_ITEMS,
  redFlagQuestion,
  redFlagQuestionsFor,
  RETIRED_RED_FLAG_ITEMS,
  routeReport,
  TIER_HEADINGS,
  WARNING_TIERS,
  type RedFlagAnswers,
} from './red-flags';
import { PainReportCreateSchema } from './schemas/athlete';

// Sources: NICE NG59, "Low back pain and sciatica in over 16s: assessment and management" (2016, updated
// 2020) [confirmed]; Finucane et al. 2020, "International framework for red flags for potential serious
// spinal pathologies", JOSPT 50(7):350–372 [confirmed]. The adolescent bending-backwards item is from memory.

const allNo = (): RedFlagAnswers => Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false]));
const only = (...ids: string[]): RedFlagAnswers => ({ ...allNo(), ...Object.fromEntries(ids.map((id) => [id, true])) });
const ids = (tier: 'emergency' | 'urgent') => RED_FLAG_ITEMS.filter((i) => i.tier === tier).map((i) => i.id);
const asked = (...regions: BodyRegion[]) => redFlagQuestionsFor(regions).map((i) => i.id);

const CAUDA_EQUINA = ['saddle_numbness', 'bladder_change', 'bowel_change', 'sexual_change', 'both_legs_new', 'leg_weakness_worsening'];
const GENERAL = ['fever_unwell', 'significant_trauma', 'night_pain', 'weight_loss'];

describe('the red-flag items (NICE NG59 2016, updated 2020; Finucane et al. 2020, JOSPT 50(7):350–372)', () => {
  it('item ids are unique across current and retired items, so one answer can never stand for two questions', () => {
    const all = [...RED_FLAG_ITEMS, ...RETIRED_RED_FLAG_ITEMS].map((i) => i.id);
    expect(new Set(all).size).toBe(all.length);
  });

  it('every possible cauda equina sign is an emergency item (NICE NG59; Finucane et al. 2020)', () => {
    expect(ids('emergency').sort()).toEqual([...CAUDA_EQUINA].sort());
  });

  it('the urgent items cover cancer, weight loss, night pain, fever, immunity/steroids, trauma, IV drug use, osteoporosis, inflammatory disease (NICE NG59; Finucane et al. 2020) and adolescent extension pain (from memory)', () => {
    expect(ids('urgent').sort()).toEqual(
      [
        'cancer_history',
        'weight_loss',
        'night_pain',
        'fever_unwell',
        'immune_steroids',
        'significant_trauma',
        'iv_drug_use',
        'osteoporosis',
        'inflammatory_disease',
        'extension_pain_adolescent',
      ].sort(),
    );
  });

  it('"symptoms in both legs" asks about new symptoms (NICE NG59; Finucane et al. 2020: new bilateral symptoms)', () => {
    expect(redFlagQuestion('both_legs_new')!.question).toMatch(/did not have before/);
    expect(redFlagQuestion('both_legs_new')!.tier).toBe('emergency');
  });

  it('the added items are in plain words, not medical terms alone (common practice: words a 16-year-old understands)', () => {
    expect(redFlagQuestion('iv_drug_use')!.question).toMatch(/injected drugs with a needle/);
    expect(redFlagQuestion('osteoporosis')!.question).toMatch(/bones are weak or thin/);
    expect(redFlagQuestion('inflammatory_disease')!.question).toMatch(/arthritis/);
    for (const i of RED_FLAG_ITEMS) expect(i.question, i.id).not.toMatch(/cauda|equina|intravenous|spondyl|pars/i);
  });

  it('every item has a question to ask and a line for the warning-signs box, never a diagnosis (common practice)', () => {
    for (const i of RED_FLAG_ITEMS) {
      expect(i.question.trim().length, i.id).toBeGreaterThan(10);
      expect(i.sign.trim().length, i.id).toBeGreaterThan(10);
      expect(`${i.question} ${i.sign}`, i.id).not.toMatch(/\byou have (a )?(fracture|cancer|infection)\b/i);
    }
  });
});

describe('the question set follows the places chosen', () => {
  it('lower back: the cauda equina signs and bending backwards, plus the general ones (NICE NG59; Finucane et al. 2020)', () => {
    expect(asked('lower_back')).toEqual(expect.arrayContaining([...CAUDA_EQUINA, 'extension_pain_adolescent', ...GENERAL]));
    expect(asked('lower_back')).toHaveLength(RED_FLAG_ITEMS.length);
  });

  it('the pelvis (marked as hip / groin) and the upper back also ask the back questions (NICE NG59: saddle and both-leg signs)', () => {
    for (const r of ['hip_groin_left', 'hip_groin_right', 'upper_back'] as const)
      expect(asked(r)).toEqual(expect.arrayContaining(CAUDA_EQUINA));
  });

  it('a knee alone: no back questions, but fever, weight loss, night pain and trauma are still asked (Finucane et al. 2020)', () => {
    const knee = asked('knee_left');
    for (const id of [...CAUDA_EQUINA, 'extension_pain_adolescent']) expect(knee, id).not.toContain(id);
    expect(knee).toEqual(expect.arrayContaining(GENERAL));
    for (const i of redFlagQuestionsFor(['knee_left'])) expect(i.question, i.id).not.toMatch(/back/i);
  });

  it('a knee and the lower back together: the back questions are asked (common practice: any back region adds them)', () => {
    expect(asked('knee_left', 'lower_back')).toEqual(asked('lower_back'));
  });

  it('property: every region asks the general questions; only back or pelvis regions ask the cauda equina signs (NICE NG59)', () => {
    fc.assert(
      fc.property(fc.subarray([...BODY_REGIONS], { minLength: 1 }), (regions) => {
        const set = asked(...regions);
        expect(set).toEqual(expect.arrayContaining(GENERAL));
        const back = regions.some((r) => ['lower_back', 'upper_back', 'hip_groin_left', 'hip_groin_right'].includes(r));
        expect(set.includes('saddle_numbness')).toBe(back);
        expect(checkRedFlagAnswers(regions, noRedFlags(regions))).toEqual({ missing: [], unknown: [] });
      }),
    );
  });

  it('checkRedFlagAnswers names the missing and the unknown questions (common practice)', () => {
    const kneeAnswers = { ...noRedFlags(['knee_left']), saddle_numbness: false };
    delete (kneeAnswers as Record<string, boolean>).night_pain;
    expect(checkRedFlagAnswers(['knee_left'], kneeAnswers)).toEqual({ missing: ['night_pain'], unknown: ['saddle_numbness'] });
  });
});

describe('old reports still read (retired ids)', () => {
  it('redFlagQuestion knows the retired "both legs" question with the words it was asked in, and its tier', () => {
    expect(redFlagQuestion('both_legs')).toMatchObject({
      question: 'Do you have pain, numbness, tingling or weakness in both legs?',
      tier: 'emergency',
      retired: true,
      replacedBy: 'both_legs_new',
    });
    expect(redFlagQuestion('made_up')).toBeUndefined();
  });

  it('a stored report that answered the retired question Yes still routes as an emergency (NICE NG59; Finucane et al. 2020)', () => {
    const stored = { ...noRedFlags(['lower_back']), both_legs_new: undefined, both_legs: true } as unknown as RedFlagAnswers;
    expect(routeReport(stored)).toBe('emergency');
    expect(flaggedItems(stored).map((i) => i.id)).toEqual(['both_legs']);
  });

  it('retired ids are never asked again (common practice)', () => {
    for (const r of RETIRED_RED_FLAG_ITEMS) expect(asked('lower_back')).not.toContain(r.id);
  });
});

describe('the warning-signs box uses the report tiers (one source)', () => {
  it('two tiers, emergency first, listing exactly the items of each tier (NICE NG59; Finucane et al. 2020)', () => {
    expect(WARNING_TIERS.map((t) => t.tier)).toEqual(['emergency', 'urgent']);
    expect(WARNING_TIERS[0].heading).toBe('Stop training and get urgent medical care now');
    expect(WARNING_TIERS.map((t) => t.heading)).toEqual([TIER_HEADINGS.emergency, TIER_HEADINGS.urgent]);
    expect(WARNING_TIERS[1].heading).toBe('Contact your clinician today');
    for (const t of WARNING_TIERS) expect(t.items.map((i) => i.id)).toEqual(ids(t.tier));
    expect(WARNING_TIERS.flatMap((t) => t.items)).toHaveLength(RED_FLAG_ITEMS.length);
  });
});

describe('routing a report (NICE NG59; Finucane et al. 2020)', () => {
  it.each(ids('emergency'))('%s alone → emergency (NICE NG59; Finucane et al. 2020)', (id) => {
    expect(routeReport(only(id))).toBe('emergency');
  });

  it.each(ids('urgent'))('%s alone → urgent (NICE NG59; Finucane et al. 2020; extension pain from memory)', (id) => {
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
    expect(flaggedItems(only('night_pain', 'both_legs_new')).map((i) => i.id)).toEqual(['both_legs_new', 'night_pain']);
    expect(flaggedItems(allNo())).toEqual([]);
  });
});
