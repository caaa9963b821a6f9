/**
 * The red-flag screen for back pain, in plain words a teenager understands. Items and their tiers
 * follow NICE NG59 (2016, updated 2020) and Finucane et al. 2020 (JOSPT 50:350–372). The screen
 * routes a report; it never diagnoses.
 */
export type RedFlagTier = 'emergency' | 'urgent';

export interface RedFlagItem {
  id: string;
  tier: RedFlagTier;
  question: string;
}

export const RED_FLAG_ITEMS: RedFlagItem[] = [
  // Emergency now — possible cauda equina (NICE NG59; Finucane 2020).
  {
    id: 'saddle_numbness',
    tier: 'emergency',
    question: 'Is there new numbness or tingling between your legs, around your bottom or private parts, or on your inner thighs?',
  },
  { id: 'bladder_change', tier: 'emergency', question: 'Is it newly hard to start peeing, to hold it in, or to feel when you need to go?' },
  { id: 'bowel_change', tier: 'emergency', question: 'Have you newly lost control of your bowels (pooing without meaning to)?' },
  { id: 'sexual_change', tier: 'emergency', question: 'Have you noticed new changes in feeling or function in your private parts?' },
  { id: 'both_legs', tier: 'emergency', question: 'Do you have pain, numbness, tingling or weakness in both legs?' },
  {
    id: 'leg_weakness_worsening',
    tier: 'emergency',
    question: 'Is one or both of your legs getting weaker (tripping, foot slapping, legs giving way)?',
  },
  // Urgent review today (NICE NG59; Finucane 2020).
  { id: 'fever_unwell', tier: 'urgent', question: 'Do you have a fever, or feel generally unwell, along with the back pain?' },
  { id: 'significant_trauma', tier: 'urgent', question: 'Did the pain start after a hard fall, crash or heavy impact?' },
  { id: 'night_pain', tier: 'urgent', question: 'Is the pain constant, even at night when you are lying still?' },
  { id: 'weight_loss', tier: 'urgent', question: 'Have you lost weight recently without trying?' },
  { id: 'cancer_history', tier: 'urgent', question: 'Have you ever been treated for cancer?' },
  {
    id: 'immune_steroids',
    tier: 'urgent',
    question: 'Do you take steroid medicine long term, or have a condition or medicine that weakens your immune system?',
  },
  // Adolescent athletes with pain on bending backwards: assess for a pars stress fracture (from memory).
  { id: 'extension_pain_adolescent', tier: 'urgent', question: 'Does it hurt more when you bend backwards or arch your back?' },
];

export type RedFlagAnswers = Record<string, boolean>;

export type ReportRoute = 'emergency' | 'urgent' | 'routine';

/**
 * Any emergency item → emergency, whatever the pain score; any urgent item → urgent; otherwise
 * routine. A high pain score alone (say 8 with no flag) is routed to the clinician, not treated as
 * an emergency (NICE NG59 2016, updated 2020; Finucane et al. 2020, JOSPT 50:350–372).
 */
export function routeReport(answers: RedFlagAnswers): ReportRoute {
  const yes = (tier: RedFlagTier) => RED_FLAG_ITEMS.some((i) => i.tier === tier && answers[i.id] === true);
  if (yes('emergency')) return 'emergency';
  if (yes('urgent')) return 'urgent';
  return 'routine';
}

export function flaggedItems(answers: RedFlagAnswers): RedFlagItem[] {
  return RED_FLAG_ITEMS.filter((i) => answers[i.id] === true);
}
