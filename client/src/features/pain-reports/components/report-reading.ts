import type { PainReportDto, PainReportToldDto } from '../../../../../policies/dto';
import { RED_FLAG_ITEMS, redFlagQuestion } from '../../../../../policies/red-flags';

/**
 * The warning-sign answers as stored, each with its question looked up by id: every "yes" first (red
 * flags first, for triage), then every "no", each group in the screen's order. The questions may be
 * reworded or replaced later; an id no longer on the screen still shows, under its own id, so a
 * clinician never misses an answer the athlete gave.
 */
export function answerRows(answers: Record<string, boolean>): { id: string; question: string; yes: boolean }[] {
  const order = new Map(RED_FLAG_ITEMS.map((item, i) => [item.id, i]));
  return (
    Object.entries(answers)
      // redFlagQuestion also knows retired questions (e.g. the old "both legs" wording), in their own words.
      .map(([id, yes]) => ({ id, yes: yes === true, question: redFlagQuestion(id)?.question ?? id, order: order.get(id) ?? Infinity }))
      .sort((a, b) => Number(b.yes) - Number(a.yes) || a.order - b.order || a.id.localeCompare(b.id))
      .map(({ id, question, yes }) => ({ id, question, yes }))
  );
}

/** What the athlete was told on screen, by the route the app gave the report. */
export const ROUTE_OUTCOME: Record<PainReportDto['route'], string> = {
  emergency: 'An emergency warning sign. The athlete was told to stop training and get urgent medical care now, and was set to Out.',
  urgent:
    'A warning sign that needs a clinician today. The athlete was told to contact their clinician today and not to train the painful area until seen.',
  routine: 'No warning sign. The athlete was told their care team had been informed and that a clinician would review the report.',
};

/** What each person was sent with the report, by the kind of notice. */
const TOLD_WORDS: Record<string, string> = {
  red_flag_emergency: 'alerted as a clinician, with the answers',
  red_flag_urgent: 'asked as a clinician to review today, with the answers',
  status_out: 'told the athlete is Out',
  red_flag_emergency_guardian: 'told as a guardian to make sure they are seen today',
  pain_report: 'told of a new pain report',
};

export const toldWords = (told: PainReportToldDto) => TOLD_WORDS[told.kind] ?? 'sent a notice';
