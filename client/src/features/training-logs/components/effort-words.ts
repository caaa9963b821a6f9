/**
 * Foster's modified CR-10 for session RPE (Foster et al. 2001, JSCR 15:109–115): whole numbers 0–10,
 * with words at 0, 1, 2, 3, 4, 5, 7 and 10. The numbers between carry no words of their own.
 */
export const EFFORT_WORDS: Record<number, string> = {
  0: 'Rest',
  1: 'Very, very easy',
  2: 'Easy',
  3: 'Moderate',
  4: 'Somewhat hard',
  5: 'Hard',
  7: 'Very hard',
  10: 'Maximal',
};

export const EFFORT_SCORES = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10] as const;

/** "5 — hard"; a number without its own word is placed between its neighbours. */
export function effortWords(score: number): string {
  if (EFFORT_WORDS[score]) return EFFORT_WORDS[score];
  const below = [...EFFORT_SCORES].reverse().find((s) => s < score && EFFORT_WORDS[s]);
  const above = EFFORT_SCORES.find((s) => s > score && EFFORT_WORDS[s]);
  return below !== undefined && above !== undefined
    ? `Between ${EFFORT_WORDS[below].toLowerCase()} and ${EFFORT_WORDS[above].toLowerCase()}`
    : '';
}
