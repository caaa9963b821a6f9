import { humanDate } from './dates';

export type FlagKind = 'red_flag_emergency' | 'red_flag_urgent' | 'pain_report' | 'pain_rule' | 'over_limit';

/**
 * What a coach reads about a flag: what it means for training, never the clinical account (no pain
 * scores, no places, no warning-sign answers — minimum necessary, 45 CFR 164.502(b)). The clinician
 * reads the flag's own message. `sessionDate` is the logged session's day for a pain-response flag.
 * A set logged over a limit is training, not a clinical account: the coach reads its own message
 * (what is over which limit), given as `message`.
 */
export function coachFlagLine(
  kind: FlagKind,
  athleteName: string,
  sessionDate: string | null = null,
  message: string | null = null,
): string {
  switch (kind) {
    case 'over_limit':
      return message ?? `${athleteName} logged a set over a limit. Their clinician and you were told.`;
    case 'red_flag_emergency':
      return `${athleteName} was told to stop training and get urgent medical care, and is Out until a clinician clears them.`;
    case 'red_flag_urgent':
      return `${athleteName} reported pain that their clinician reviews today. Keep to the current limits until the clinician decides.`;
    case 'pain_report':
      return `${athleteName} reported pain. Their clinician reads the report and decides on any change.`;
    case 'pain_rule':
      return sessionDate
        ? `${athleteName}'s response to the session of ${humanDate(sessionDate)} calls for a lighter next session.`
        : `${athleteName}'s response to a recent session calls for a lighter next session.`;
  }
}
