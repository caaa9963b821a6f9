import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

const numeric = { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) };

/** A clinician's assessment of one stage criterion, or the athlete's readiness rating (0–10). */
@Entity({ name: 'stage_criterion_readings' })
export class StageCriterionReading {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'plan_id' })
  planId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'stage_id' })
  stageId: string;

  @Column('varchar', { length: 12 })
  kind: 'assessment' | 'readiness';

  @Column('uuid', { name: 'criterion_id', nullable: true })
  criterionId: string | null;

  @Column('date', { name: 'reading_date' })
  readingDate: string;

  @Column('numeric', { precision: 12, scale: 3, nullable: true, transformer: numeric })
  value: number | null;

  @Column('boolean', { nullable: true })
  met: boolean | null;

  @Column('varchar', { length: 500, nullable: true })
  note: string | null;

  @Column('uuid', { name: 'recorded_by', nullable: true })
  recordedBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}

/** A move to the next stage: a shared decision, with who agreed. */
@Entity({ name: 'stage_decisions' })
export class StageDecision {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'plan_id' })
  planId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'from_stage_id' })
  fromStageId: string;

  @Column('uuid', { name: 'to_stage_id' })
  toStageId: string;

  @Column('date', { name: 'effective_date' })
  effectiveDate: string;

  @Column('date', { name: 'planned_date' })
  plannedDate: string;

  @Column('int', { name: 'days_early' })
  daysEarly: number;

  @Column('text', { name: 'agreed_by', array: true })
  agreedBy: string[];

  @Column('int', { name: 'criteria_met' })
  criteriaMet: number;

  @Column('int', { name: 'criteria_total' })
  criteriaTotal: number;

  @Column('int', { name: 'plan_version' })
  planVersion: number;

  @Column('varchar', { length: 500, nullable: true })
  note: string | null;

  @Column('uuid', { name: 'decided_by', nullable: true })
  decidedBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
