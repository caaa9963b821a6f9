import { BACK_OR_PELVIS_REGIONS, type BodyRegion } from './body-regions';

/**
 * The red-flag screen, in plain words a 16-year-old understands. Items and their tiers follow
 * NICE NG59 (2016, updated 2020) and Finucane et al. 2020 (JOSPT 50(7):350–372). The screen routes a
 * report to the right speed of care; it never diagnoses.
 *
 * This file is the one source for the questions the pain-report form asks, the tier each answer is
 * routed by on the server, and the warning-signs box shown around the app.
 */
export type RedFlagTier = 'emergency' | 'urgent';

/** Which reports ask an item: every report, or only those naming the back or pelvis. */
export type RedFlagScope = 'all' | 'back_or_pelvis';

export interface RedFlagItem {
  id: string;
  tier: RedFlagTier;
  scope: RedFlagScope;
  /** What the form asks. Stored answers are keyed by `id`, so this text must keep its meaning. */
  question: string;
  /** The same sign as a short line for the warning-signs box. */
  sign: string;
}

/** A question no longer asked: kept so that reports which answered it still read and route as they did. */
export interface RetiredRedFlagItem extends RedFlagItem {
  retired: true;
  /** The id that asks it now, if any. */
  replacedBy?: string;
}

export const RED_FLAG_ITEMS: readonly RedFlagItem[] = [
  // Emergency now — possible cauda equina (NICE NG59; Finucane et al. 2020). Asked for the back or pelvis.
  {
    id: 'saddle_numbness',
    tier: 'emergency',
    scope: 'back_or_pelvis',
    question: 'Is there new numbness or tingling between your legs, around your bottom or private parts, or on your inner thighs?',
    sign: 'new numbness or tingling around your bottom, private parts or inner thighs',
  },
  {
    id: 'bladder_change',
    tier: 'emergency',
    scope: 'back_or_pelvis',
    question: 'Is it newly hard to start peeing, to hold it in, or to feel when you need to go?',
    sign: 'new trouble peeing, holding it in, or feeling when you need to go',
  },
  {
    id: 'bowel_change',
    tier: 'emergency',
    scope: 'back_or_pelvis',
    question: 'Have you newly lost control of your bowels (pooing without meaning to)?',
    sign: 'new loss of control of your bowels',
  },
  {
    id: 'sexual_change',
    tier: 'emergency',
    scope: 'back_or_pelvis',
    question: 'Have you noticed new changes in feeling or function in your private parts?',
    sign: 'new changes in feeling or function in your private parts',
  },
  {
    id: 'both_legs_new',
    tier: 'emergency',
    scope: 'back_or_pelvis',
    question: 'Have you started to have pain, numbness, tingling or weakness in both legs that you did not have before?',
    sign: 'new pain, numbness, tingling or weakness in both legs',
  },
  {
    id: 'leg_weakness_worsening',
    tier: 'emergency',
    scope: 'back_or_pelvis',
    question: 'Is one or both of your legs getting weaker (tripping, foot slapping, legs giving way)?',
    sign: 'a leg that keeps getting weaker (tripping, foot slapping, giving way)',
  },
  // Contact your clinician today (NICE NG59; Finucane et al. 2020). Asked whatever the place.
  {
    id: 'fever_unwell',
    tier: 'urgent',
    scope: 'all',
    question: 'Do you have a fever, or feel generally unwell, along with the pain?',
    sign: 'you have a fever, or feel generally unwell',
  },
  {
    id: 'significant_trauma',
    tier: 'urgent',
    scope: 'all',
    question: 'Did the pain start after a hard fall, crash or heavy impact?',
    sign: 'it started after a hard fall, crash or heavy impact',
  },
  {
    id: 'night_pain',
    tier: 'urgent',
    scope: 'all',
    question: 'Is the pain constant, even at night when you are lying still?',
    sign: 'it never stops, even at night when you lie still',
  },
  {
    id: 'weight_loss',
    tier: 'urgent',
    scope: 'all',
    question: 'Have you lost weight recently without trying?',
    sign: 'you have lost weight without trying',
  },
  {
    id: 'cancer_history',
    tier: 'urgent',
    scope: 'all',
    question: 'Have you ever been treated for cancer?',
    sign: 'you have ever been treated for cancer',
  },
  {
    id: 'immune_steroids',
    tier: 'urgent',
    scope: 'all',
    question: 'Do you take steroid medicine long term, or have a condition or medicine that weakens your immune system?',
    sign: 'you take steroid medicine long term, or something weakens your immune system',
  },
  {
    id: 'osteoporosis',
    tier: 'urgent',
    scope: 'all',
    question: 'Has a doctor ever told you that your bones are weak or thin (osteoporosis)?',
    sign: 'a doctor has told you your bones are weak or thin (osteoporosis)',
  },
  {
    id: 'inflammatory_disease',
    tier: 'urgent',
    scope: 'all',
    question:
      'Has a doctor ever told you that you have a long-term condition that causes inflammation, such as arthritis, psoriasis, or Crohn’s or colitis (a gut condition)?',
    sign: 'you have a long-term condition that causes inflammation, such as arthritis, psoriasis, Crohn’s or colitis',
  },
  {
    id: 'iv_drug_use',
    tier: 'urgent',
    scope: 'all',
    question: 'Have you ever injected drugs with a needle that a doctor did not give you?',
    sign: 'you have injected drugs that a doctor did not give you',
  },
  // Adolescent athletes with pain on bending backwards: assess for a pars stress fracture (from memory).
  {
    id: 'extension_pain_adolescent',
    tier: 'urgent',
    scope: 'back_or_pelvis',
    question: 'Does it hurt more when you bend backwards or arch your back?',
    sign: 'your back hurts more when you bend backwards or arch it',
  },
];

/** Questions asked before, with the words they were asked in. Never remove one: stored reports use these ids. */
export const RETIRED_RED_FLAG_ITEMS: readonly RetiredRedFlagItem[] = [
  {
    id: 'both_legs',
    tier: 'emergency',
    scope: 'back_or_pelvis',
    question: 'Do you have pain, numbness, tingling or weakness in both legs?',
    sign: 'pain, numbness, tingling or weakness in both legs',
    retired: true,
    // NICE NG59 and Finucane et al. 2020 name *new* symptoms in both legs; the old words caught long-standing ones too.
    replacedBy: 'both_legs_new',
  },
];

const BY_ID: ReadonlyMap<string, RedFlagItem | RetiredRedFlagItem> = new Map(
  [...RED_FLAG_ITEMS, ...RETIRED_RED_FLAG_ITEMS].map((i) => [i.id, i]),
);

/**
 * The item behind a stored answer, current or retired — for showing a report's answers with the
 * words that were asked. Undefined for an id that was never a question.
 */
export function redFlagQuestion(id: string): RedFlagItem | RetiredRedFlagItem | undefined {
  return BY_ID.get(id);
}

/** Whether the places chosen include the back or pelvis, which adds the back-specific questions. */
export function includesBackOrPelvis(regions: readonly BodyRegion[]): boolean {
  return regions.some((r) => BACK_OR_PELVIS_REGIONS.includes(r));
}

/** The questions a report about these places asks, in the order of RED_FLAG_ITEMS (the form groups them by scope). */
export function redFlagQuestionsFor(regions: readonly BodyRegion[]): RedFlagItem[] {
  const back = includesBackOrPelvis(regions);
  return RED_FLAG_ITEMS.filter((i) => i.scope === 'all' || back);
}

export type RedFlagAnswers = Record<string, boolean>;

/** Every question for these places answered No: what a report with no warning sign sends. */
export function noRedFlags(regions: readonly BodyRegion[]): RedFlagAnswers {
  return Object.fromEntries(redFlagQuestionsFor(regions).map((i) => [i.id, false]));
}

/** The missing and unknown answers for these places; both empty when the answers fit. */
export function checkRedFlagAnswers(regions: readonly BodyRegion[], answers: Readonly<Record<string, unknown>>) {
  const asked = redFlagQuestionsFor(regions);
  const ids = new Set(asked.map((i) => i.id));
  return {
    missing: asked.filter((i) => !Object.hasOwn(answers, i.id)).map((i) => i.id),
    unknown: Object.keys(answers).filter((id) => !ids.has(id)),
  };
}

export type ReportRoute = 'emergency' | 'urgent' | 'routine';

/**
 * Any emergency item → emergency, whatever the pain score; any urgent item → urgent; otherwise
 * routine. A high pain score alone (say 8 with no flag) is routed to the clinician, not treated as
 * an emergency (NICE NG59 2016, updated 2020; Finucane et al. 2020, JOSPT 50:350–372). Retired ids
 * keep their tier, so a stored report routes as it did when it was sent.
 */
export function routeReport(answers: RedFlagAnswers): ReportRoute {
  const flagged = flaggedItems(answers);
  if (flagged.some((i) => i.tier === 'emergency')) return 'emergency';
  if (flagged.some((i) => i.tier === 'urgent')) return 'urgent';
  return 'routine';
}

/** The items answered Yes (only a real `true`), current ones in screen order, then retired ones. */
export function flaggedItems(answers: RedFlagAnswers): RedFlagItem[] {
  return [...RED_FLAG_ITEMS, ...RETIRED_RED_FLAG_ITEMS].filter((i) => answers[i.id] === true);
}

/** The heading of each tier, the same on the report's outcome screen and in the warning-signs box. */
export const TIER_HEADINGS: Readonly<Record<RedFlagTier, string>> = {
  emergency: 'Stop training and get urgent medical care now',
  urgent: 'Contact your clinician today',
};

/** What the warning-signs box says for each tier: the same two tiers, and items, the report routes by. */
export const WARNING_TIERS: readonly { tier: RedFlagTier; heading: string; action: string; items: readonly RedFlagItem[] }[] = [
  {
    tier: 'emergency',
    heading: TIER_HEADINGS.emergency,
    action: 'Do not wait, and do not train, if you notice any of these:',
    items: RED_FLAG_ITEMS.filter((i) => i.tier === 'emergency'),
  },
  {
    tier: 'urgent',
    heading: TIER_HEADINGS.urgent,
    action: 'Rest the painful area until you have spoken to them, if you have pain and any of these is true:',
    items: RED_FLAG_ITEMS.filter((i) => i.tier === 'urgent'),
  },
];
