import type { DataSource, EntityManager } from 'typeorm';
import type { WorkloadDto } from '../../../policies/dto';
import { acuteChronic, describeRatio, sessionLoad, weekSummary, CHRONIC_DAYS } from '../../../policies/load/workload';
import { estimateOneRm } from '../../../policies/load/one-rm';
import type { PlanStage } from '../../../policies/load/in-force';
import { shiftDate } from './training-logs';

type Db = DataSource | EntityManager;

interface LogRow {
  date: string;
  duration_minutes: number;
  session_rpe: number;
  pain_during: number;
  pain_next_morning: number | null;
  pain_ceiling: number;
  sets: { exercise: string; loadKg: number; reps: number; rpe?: number | null }[];
}

/**
 * An athlete's workload up to `to`: daily session loads (rest days 0), 7-day blocks with monotony
 * and strain, the EWMA acute:chronic ratio over the whole history (hidden before 28 days), pain
 * against load, best estimated 1RM per exercise per day, and the plan stages for shading.
 */
export async function workload(db: Db, athleteId: string, to: string, days: number): Promise<WorkloadDto> {
  const from = shiftDate(to, -(days - 1));
  const logs: LogRow[] = await db.query(
    `SELECT date, duration_minutes, session_rpe, pain_during, pain_next_morning, pain_ceiling, sets
       FROM training_logs WHERE athlete_id = $1 AND date <= $2 ORDER BY date, created_at`,
    [athleteId, to],
  );
  const loadByDate = new Map<string, number>();
  for (const l of logs) loadByDate.set(l.date, (loadByDate.get(l.date) ?? 0) + sessionLoad(l.session_rpe, l.duration_minutes));

  const first = logs[0]?.date ?? to;
  const history: number[] = [];
  for (let d = first; d <= to; d = shiftDate(d, 1)) history.push(loadByDate.get(d) ?? 0);
  const ac = acuteChronic(history);
  const daysOfData = logs.length ? history.length : 0;

  const daily: WorkloadDto['daily'] = [];
  for (let d = from; d <= to; d = shiftDate(d, 1)) daily.push({ date: d, load: loadByDate.get(d) ?? 0 });
  const weeks: WorkloadDto['weeks'] = [];
  for (let end = daily.length; end >= 7; end -= 7) {
    const block = daily.slice(end - 7, end);
    const s = weekSummary(block.map((b) => b.load));
    weeks.unshift({ start: block[0].date, end: block[6].date, total: s.total, monotony: s.monotony, strain: s.strain });
  }

  const inRange = logs.filter((l) => l.date >= from);
  const pain = inRange.map((l) => ({
    date: l.date,
    during: l.pain_during,
    nextMorning: l.pain_next_morning,
    ceiling: l.pain_ceiling,
    load: sessionLoad(l.session_rpe, l.duration_minutes),
  }));
  const best = new Map<string, WorkloadDto['e1rm'][number]>();
  for (const l of inRange) {
    for (const set of l.sets) {
      const est = estimateOneRm(set.loadKg, set.reps, set.rpe ?? null);
      if (!est) continue;
      const key = `${set.exercise.toLowerCase()}|${l.date}`;
      const prev = best.get(key);
      if (!prev || est.value > prev.value)
        best.set(key, { exercise: set.exercise, date: l.date, value: Math.round(est.value * 10) / 10, lowReliability: est.lowReliability });
    }
  }
  const planRows: { stages: PlanStage[] }[] = await db.query(
    `SELECT v.stages FROM restriction_plans p JOIN restriction_plan_versions v ON v.plan_id = p.id AND v.version = p.version WHERE p.athlete_id = $1`,
    [athleteId],
  );
  const stages = planRows
    .flatMap((p) => p.stages)
    .filter((s) => s.endDate >= from && s.startDate <= to)
    .map((s) => ({ label: s.label ?? null, startDate: s.startDate, endDate: s.endDate }));

  return {
    athleteId,
    from,
    to,
    daily,
    weeks,
    acuteChronic: {
      acute: ac.acute,
      chronic: ac.chronic,
      ratio: daysOfData >= CHRONIC_DAYS ? ac.ratio : null,
      description: describeRatio(daysOfData >= CHRONIC_DAYS ? ac.ratio : null),
      daysOfData,
    },
    pain,
    e1rm: [...best.values()],
    stages,
  };
}
