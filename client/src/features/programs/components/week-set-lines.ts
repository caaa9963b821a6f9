import type { AthleteWeekDto } from '../../../../../policies/dto';
import { plannedLoadOnTheBarKg } from '../../../../../policies/load/bar-cap';
import { formatLoad } from '../../../../../policies/load/units';
import type { Unit } from '../../../../../policies/schemas';

type WeekSession = AthleteWeekDto['days'][number]['sessions'][number];

/**
 * Consecutive identical sets in one line: "2 sets of 5 reps at 40 kg · RPE 6". A load planned in kg and
 * read in pounds is what goes on the bar, rounded down (plannedLoadOnTheBarKg), never 26.46 lb.
 */
export function setLines(session: WeekSession, exercise: WeekSession['content']['exercises'][number], unit: Unit): string[] {
  const lines: { words: string; count: number }[] = [];
  for (const set of exercise.sets) {
    const kg = session.loadsKg[set.id] ?? null;
    const load =
      set.load.kind === 'bodyweight'
        ? 'body weight'
        : kg === null
          ? `${set.load.value}% of your best lift`
          : formatLoad(set.load.kind === unit ? kg : plannedLoadOnTheBarKg(kg, unit), unit);
    const words = `${set.reps} ${set.reps === 1 ? 'rep' : 'reps'} at ${load}${set.targetRpe != null ? ` · RPE ${set.targetRpe}` : ''}${set.warmUp ? ' (warm-up)' : ''}`;
    const last = lines.at(-1);
    if (last?.words === words) last.count++;
    else lines.push({ words, count: 1 });
  }
  return lines.map((l) => (l.count > 1 ? `${l.count} sets of ${l.words}` : `1 set of ${l.words}`));
}
