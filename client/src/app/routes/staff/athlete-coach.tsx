import type { CaseloadRowDto } from '../../../../../policies/dto';
import { useCases } from '../../../features/cases/api/get-cases';
import { regionsText } from '../../../features/cases/components/case-words';
import { isNoAccess, useInForce } from '../../../features/plans/api/get-in-force';
import { CurrentLetter } from '../../../features/letters/components/CurrentLetter';
import { usePlans } from '../../../features/plans/api/get-plan';
import { InForceSummary } from '../../../features/plans/components/InForceSummary';
import { PlanStagesView } from '../../../features/plans/components/PlanStagesView';
import { StageCriteriaPanel } from '../../../features/stage-criteria/components/StageCriteriaPanel';
import { AthletePrograms } from '../../../features/programs/components/AthletePrograms';
import { BaselinesPanel } from '../../../features/programs/components/BaselinesPanel';
import { ClipsSection } from '../../../features/clips/components/ClipsSection';
import { ClinicalRecordCaution } from '../../../components/Cautions';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Badge, Facts, Loading, Panel } from '../../../components/ui/Panel';
import { StatusMark } from '../../../components/ui/StatusMark';
import { todayLocal } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { RoleGate } from '../../layout/RoleGate';
import { AthleteHeader, StaffAthletePage, sportAndAge, type AthleteView } from './athlete-page';

/**
 * One athlete for their coach: status, dates and the functional limits in force today and coming.
 * The server sends coaches no diagnosis and no notes, and this page has no place for them.
 */
export function CoachAthletePage() {
  return (
    <RoleGate role="coach">
      <StaffAthletePage view={COACH_VIEW} />
    </RoleGate>
  );
}

function CoachSections({ row }: { row: CaseloadRowDto }) {
  const { orgId, user } = useCurrentMembership();
  const today = todayLocal();
  const cases = useCases(orgId, { athleteId: row.athleteId, state: 'open' });
  const inForce = useInForce(orgId, row.athleteId, today);
  const planIds = (cases.data ?? []).map((c) => c.planId).filter((id): id is string => !!id);
  const plans = usePlans(orgId, planIds);
  const allStages = plans.flatMap((p) => p.data?.current.stages ?? []);
  const numbers = new Map(plans.flatMap((p) => (p.data?.current.stages ?? []).map((s, i) => [s.id, i + 1] as const)));
  const upcoming = allStages.filter((s) => s.startDate > today).sort((a, b) => (a.startDate < b.startDate ? -1 : 1));

  return (
    <>
      <AthleteHeader row={row}>
        {sportAndAge(row)}
        {row.isMinor && (
          <>
            {' '}
            <Badge>Minor</Badge>
          </>
        )}
      </AthleteHeader>
      <ClinicalRecordCaution audience="team" />

      <Panel title="Status">
        <Facts
          items={[
            { label: 'Status', value: <StatusMark status={row.status} explain /> },
            { label: 'Since', value: row.statusEffectiveFrom ? formatDate(row.statusEffectiveFrom) : 'no open case' },
            { label: 'Next review', value: row.nextReviewDate ? formatDate(row.nextReviewDate) : 'none set' },
          ]}
        />
        {(cases.data ?? []).length > 0 && (
          <ul className="mt-3 space-y-2 text-sm">
            {cases.data!.map((c) => (
              <li key={c.id} className="rounded-md border border-rule px-3 py-2">
                <span className="font-semibold">{regionsText(c.bodyRegions)}</span>
                <span className="text-ink-2 tabular-nums">
                  {' '}
                  · onset {formatDate(c.onsetDate)}
                  {c.reviewDate && ` · review ${formatDate(c.reviewDate)}`}
                </span>
                {c.statusNote && <p className="mt-0.5">“{c.statusNote}”</p>}
              </li>
            ))}
          </ul>
        )}
        {cases.isError && <ErrorNotice error={cases.error} className="mt-3" />}
      </Panel>

      {!(inForce.isError && isNoAccess(inForce.error)) && (
        <Panel title="What is allowed today">
          <p className="mb-3 text-sm text-muted">Today, {formatDate(today)}. Program under these; the clinician sets them.</p>
          {inForce.isPending ? (
            <Loading what="the limits" />
          ) : inForce.isError ? (
            <ErrorNotice error={inForce.error} />
          ) : (
            <InForceSummary inForce={inForce.data} unit={user.unitPref} showStatus={false} />
          )}
        </Panel>
      )}

      <Panel title="Clearance letter">
        <CurrentLetter orgId={orgId} athleteId={row.athleteId} audience="coach" />
      </Panel>

      {planIds.length > 0 && (
        <Panel title="What unlocks the next stage">
          <p className="mb-3 text-sm text-muted">
            Read only: the clinician records the checks and moves the stage on with the athlete (and family). Tell them what you see in
            training.
          </p>
          <div className="space-y-3">
            {planIds.map((id) => (
              <StageCriteriaPanel key={id} orgId={orgId} planId={id} />
            ))}
          </div>
        </Panel>
      )}

      <Panel title="Upcoming stages">
        {cases.isPending || plans.some((p) => p.isPending) ? (
          <Loading what="the plans" />
        ) : upcoming.length === 0 ? (
          <p className="text-sm text-ink-2">No later stage is planned yet.</p>
        ) : (
          <PlanStagesView stages={upcoming} unit={user.unitPref} today={today} numbers={numbers} />
        )}
        {plans.map((p, i) => p.isError && <ErrorNotice key={planIds[i]} error={p.error} className="mt-3" />)}
      </Panel>

      <ClipsSection orgId={orgId} athleteId={row.athleteId} athleteName={row.athleteName} />

      <Panel title="Programs">
        <AthletePrograms orgId={orgId} athleteId={row.athleteId} athleteName={row.athleteName} today={today} />
      </Panel>

      <Panel title="Baselines">
        <p className="mb-3 text-sm text-muted">Each lift&apos;s current 1RM: caps given as a % of 1RM are worked out from it.</p>
        <BaselinesPanel orgId={orgId} athleteId={row.athleteId} unit={user.unitPref} canRecord />
      </Panel>
    </>
  );
}

const COACH_VIEW: AthleteView = {
  back: { to: '/coach', label: 'My athletes' },
  notYours: 'Not one of your athletes',
  Sections: CoachSections,
};
