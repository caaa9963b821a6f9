import type { EntityManager } from 'typeorm';
import type { BodyRegion } from '../../../policies/body-regions';
import { addDays } from '../../../policies/today';

/**
 * A season for the injury report (policies/load/injury-report.ts): 26 weeks of the softball infield's
 * practice and game hours, recorded as a coach would (the whole group, a few absentees), and the
 * season's earlier injuries of the infielders — closed cases with their status history. Rows are written
 * directly (history, not decisions: no audit entries, no notices), by fixed formulas, so every load gives
 * the same season relative to its day. With Maya's, Tessa's, Sam's and Jordan's cases the report has a
 * total to show, and its smaller rows show how small cells are withheld. Invented people and numbers.
 */
export const INJURY_SEASON_DAYS = 182;

interface PastInjury {
  athlete: string;
  region: BodyRegion;
  /** Days before today the injury began. */
  onset: number;
  out: number;
  limited: number;
}

export const PAST_INJURIES: PastInjury[] = [
  { athlete: 'riley', region: 'ankle_foot_right', onset: 170, out: 4, limited: 6 },
  { athlete: 'hana', region: 'shoulder_right', onset: 150, out: 0, limited: 9 },
  { athlete: 'nia', region: 'knee_left', onset: 131, out: 7, limited: 14 },
  { athlete: 'jade', region: 'thigh_left', onset: 118, out: 3, limited: 8 },
  { athlete: 'lena', region: 'ankle_foot_left', onset: 97, out: 2, limited: 5 },
  { athlete: 'zoe', region: 'lower_back', onset: 84, out: 0, limited: 12 },
  { athlete: 'isla', region: 'wrist_hand_right', onset: 66, out: 5, limited: 4 },
  { athlete: 'riley', region: 'thigh_right', onset: 45, out: 2, limited: 7 },
];

export async function loadInjurySeason(
  m: EntityManager,
  organizationId: string,
  today: string,
  groupId: string,
  athletes: Record<string, string>,
  groupAthleteKeys: string[],
): Promise<void> {
  // Who was Out on which day (absent from that day's session).
  const outOn = new Set<string>();
  for (const p of PAST_INJURIES) {
    const onset = addDays(today, -p.onset);
    const limitedFrom = addDays(onset, p.out);
    const fullFrom = addDays(limitedFrom, p.limited);
    const [c] = (await m.query(
      `INSERT INTO cases (organization_id, athlete_id, body_regions, onset_date, closed_on, closing_note, version)
       VALUES ($1, $2, $3, $4, $5, 'Back to full training.', 1) RETURNING id`,
      [organizationId, athletes[p.athlete], [p.region], onset, addDays(fullFrom, 7)],
    )) as { id: string }[];
    const rows: [string, string][] = [];
    if (p.out > 0) rows.push(['out', onset]);
    rows.push(['limited', limitedFrom], ['full', fullFrom]);
    for (const [status, from] of rows)
      await m.query(
        `INSERT INTO participation_status_changes (organization_id, athlete_id, case_id, status, effective_from) VALUES ($1, $2, $3, $4, $5)`,
        [organizationId, athletes[p.athlete], c.id, status, from],
      );
    for (let i = 0; i < p.out; i++) outOn.add(`${p.athlete}:${addDays(onset, i)}`);
  }
  // Practice four days a week (120 min), a game once a week (150 min).
  for (let d = -INJURY_SEASON_DAYS; d <= -1; d++) {
    const weekday = (d + 700) % 7;
    const kind = weekday === 6 ? 'competition' : [1, 2, 4, 5].includes(weekday) ? 'practice' : null;
    if (!kind) continue;
    const date = addDays(today, d);
    const present = groupAthleteKeys
      .filter((key, i) => (i * 5 - d + 1000) % 23 !== 0 && !outOn.has(`${key}:${date}`))
      .map((key) => athletes[key]);
    await m.query(
      `INSERT INTO team_session_hours (organization_id, group_id, date, minutes, kind, athlete_ids) VALUES ($1, $2, $3, $4, $5, $6::uuid[])`,
      [organizationId, groupId, date, kind === 'competition' ? 150 : 120, kind, present],
    );
  }
}
