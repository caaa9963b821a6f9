import type { Breach } from '../../../../../policies/load/compliance';
import { Notice } from '../../../components/ui/Notice';

type HeldExercise = { exerciseId: string; sets: { id: string }[] };

/** "set 2" or "sets 1, 2 and 3", by the sets' places in their exercise. */
function setNumbers(numbers: number[]): string {
  if (numbers.length === 1) return `set ${numbers[0]}`;
  return `sets ${numbers.slice(0, -1).join(', ')} and ${numbers.at(-1)}`;
}

/**
 * One line per exercise and reason, naming the sets it holds: the same reason for three sets of one
 * exercise is said once ("Deadlift, sets 1, 2 and 3: …"), not three times without saying which.
 */
export function holdLines(breaches: Breach[], exercises: HeldExercise[], exerciseName: (id: string) => string): string[] {
  const where = new Map<string, { exercise: number; set: number }>();
  exercises.forEach((e, i) => e.sets.forEach((s, j) => where.set(s.id, { exercise: i, set: j + 1 })));
  const groups = new Map<string, { exerciseId: string; message: string; sets: number[] }>();
  for (const b of breaches) {
    const at = where.get(b.setId);
    const key = `${at?.exercise ?? b.exerciseId}\u0000${b.message}`;
    const group = groups.get(key) ?? { exerciseId: b.exerciseId, message: b.message, sets: [] };
    if (at && !group.sets.includes(at.set)) group.sets.push(at.set);
    groups.set(key, group);
  }
  return [...groups.values()].map(
    (g) => `${exerciseName(g.exerciseId)}${g.sets.length ? `, ${setNumbers(g.sets.sort((a, b) => a - b))}` : ''}: ${g.message}`,
  );
}

/**
 * A published session that a later plan change put past a cap: the athlete sees it without loads
 * until the coach changes it to fit (or an exception covers it).
 */
export function HoldNotice({
  athleteName,
  breaches,
  exercises,
  exerciseName,
}: {
  athleteName: string;
  breaches: Breach[];
  exercises: HeldExercise[];
  exerciseName: (id: string) => string;
}) {
  return (
    <Notice tone="problem" title={`On hold for ${athleteName} — update it to fit`}>
      <p>
        The limits changed after this session was published. {athleteName} sees it without loads until every set below fits again; saving a
        version that fits takes it off hold.
      </p>
      <ul aria-label={`Why it is on hold for ${athleteName}`} className="mt-1 list-disc space-y-0.5 pl-5 tabular-nums">
        {holdLines(breaches, exercises, exerciseName).map((line) => (
          <li key={line}>{line}</li>
        ))}
      </ul>
    </Notice>
  );
}
