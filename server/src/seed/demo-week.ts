import type { DemoDirector } from './demo-story';

/**
 * The coming week as the coaches published it, through the same publish command the builder uses, so
 * each session is checked against the athletes' limits (Sam's ankle plan included) like any other.
 * Maya's sessions are part of her story (demo-story.ts).
 */
export async function upcomingWeek(d: DemoDirector, programs: Map<string, string>): Promise<void> {
  const day = d.day;
  await d.publish(
    'coachTheo',
    programs.get('jordan')!,
    day(1),
    'Erg and strength',
    d.session([
      { name: 'Deadlift', sets: 3, reps: 5, kg: 120 },
      { name: 'Bent-over row', sets: 3, reps: 8, kg: 60 },
    ]),
  );
  await d.publish(
    'coachTheo',
    programs.get('jordan')!,
    day(4),
    'Erg and strength',
    d.session([
      { name: 'Trap-bar deadlift', sets: 4, reps: 4, kg: 130 },
      { name: 'Pull-up', sets: 3, reps: 6 },
    ]),
  );
  // Sam and Ava share a program: upper body fits Sam's ankle plan as it stands.
  for (const offset of [1, 3]) {
    await d.publish(
      'coachRosa',
      programs.get('sam')!,
      day(offset),
      'Upper body and trunk',
      d.session([
        { name: 'Dumbbell bench press', sets: 3, reps: 10, kg: 16 },
        { name: 'Single-arm dumbbell row', sets: 3, reps: 10, kg: 18 },
        { name: 'Pallof press', sets: 3, reps: 10, kg: 10 },
      ]),
    );
  }
  await d.publish(
    'coachRosa',
    programs.get('luis')!,
    day(1),
    'Squat and pull',
    d.session([
      { name: 'Back squat', sets: 5, reps: 3, kg: 145 },
      { name: 'Power clean', sets: 5, reps: 2, kg: 95 },
    ]),
  );
  await d.publish(
    'coachRosa',
    programs.get('luis')!,
    day(3),
    'Press and pull',
    d.session([
      { name: 'Overhead press', sets: 4, reps: 5, kg: 60 },
      { name: 'Pull-up', sets: 4, reps: 6 },
    ]),
  );
}
