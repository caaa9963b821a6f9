import type { DataSource, EntityManager } from 'typeorm';
import type { PlanStage } from '../../../policies/load/in-force';
import { evaluateStageCriteria, type CriteriaEvidence, type StageCriteriaResult } from '../../../policies/load/stage-criteria';

type Db = DataSource | EntityManager;

/**
 * The evidence for one stage's criteria, from the stage's first day to today: the athlete's training
 * logs, the dates of pain reports routed by a red-flag answer (route other than routine; day in the
 * organization's zone), the clinician's assessments and the athlete's readiness ratings of this stage.
 */
export async function stageEvidence(
  db: Db,
  input: { planId: string; athleteId: string; stage: Pick<PlanStage, 'id' | 'startDate'>; today: string; timeZone: string },
): Promise<CriteriaEvidence> {
  const { planId, athleteId, stage, today, timeZone } = input;
  const logs: CriteriaEvidence['logs'] = await db.query(
    `SELECT to_char(date, 'YYYY-MM-DD') AS date, pain_before AS "painBefore", pain_during AS "painDuring",
            pain_next_morning AS "painNextMorning", session_rpe AS "sessionRpe", (session_id IS NOT NULL) AS planned
       FROM training_logs WHERE athlete_id = $1 AND date >= $2 AND date <= $3 ORDER BY date, created_at`,
    [athleteId, stage.startDate, today],
  );
  const flagged: { date: string }[] = await db.query(
    `SELECT to_char((reported_at AT TIME ZONE $4)::date, 'YYYY-MM-DD') AS date
       FROM pain_reports WHERE athlete_id = $1 AND route <> 'routine'
        AND (reported_at AT TIME ZONE $4)::date BETWEEN $2 AND $3`,
    [athleteId, stage.startDate, today, timeZone],
  );
  const readings: {
    kind: string;
    criterionId: string | null;
    date: string;
    value: string | null;
    met: boolean | null;
    note: string | null;
  }[] = await db.query(
    `SELECT kind, criterion_id AS "criterionId", to_char(reading_date, 'YYYY-MM-DD') AS date, value, met, note
         FROM stage_criterion_readings WHERE plan_id = $1 AND stage_id = $2 ORDER BY reading_date, created_at`,
    [planId, stage.id],
  );
  return {
    stageStart: stage.startDate,
    today,
    logs,
    redFlagDates: flagged.map((f) => f.date),
    assessments: readings
      .filter((r) => r.kind === 'assessment' && r.criterionId)
      .map((r) => ({
        criterionId: r.criterionId!,
        date: r.date,
        value: r.value === null ? null : Number(r.value),
        met: r.met,
        note: r.note,
      })),
    ratings: readings.filter((r) => r.kind === 'readiness' && r.value !== null).map((r) => ({ date: r.date, value: Number(r.value) })),
  };
}

/** The stage's criteria evaluated on today's evidence. */
export async function evaluateStage(
  db: Db,
  input: { planId: string; athleteId: string; stage: PlanStage; today: string; timeZone: string },
): Promise<StageCriteriaResult> {
  const ev = await stageEvidence(db, input);
  return evaluateStageCriteria(input.stage.criteria ?? [], ev);
}
