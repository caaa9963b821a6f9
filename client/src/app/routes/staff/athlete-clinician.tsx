import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { asSubject } from '../../../../../policies/access';
import type { CaseloadRowDto } from '../../../../../policies/dto';
import { useCases } from '../../../features/cases/api/get-cases';
import { CaseList } from '../../../features/cases/components/CaseList';
import { OpenCaseForm } from '../../../features/cases/components/OpenCaseForm';
import { InForcePanel } from '../../../features/plans/components/InForcePanel';
import { ClearanceLetters } from '../../../features/letters/components/ClearanceLetters';
import { ClipsSection } from '../../../features/clips/components/ClipsSection';
import { PainReportList } from '../../../features/pain-reports/components/PainReportList';
import { ClinicalRecordCaution } from '../../../components/Cautions';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Badge, Loading, Panel } from '../../../components/ui/Panel';
import { StatusMark } from '../../../components/ui/StatusMark';
import { useAppAbility } from '../../../lib/ability';
import { formatDate } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { clinicianCaseHref } from '../clinician/paths';
import { AthleteHeader, StaffAthletePage, sportAndAge, type AthleteView } from './athlete-page';

/**
 * One athlete for their clinician: the cases (open and closed, opened here), the limits in force on
 * any date, clips and clearance letters. The clinician's layout holds the role gate.
 */
export function ClinicianAthletePage() {
  return <StaffAthletePage view={CLINICIAN_VIEW} />;
}

function ClinicianSections({ row }: { row: CaseloadRowDto }) {
  const { orgId, user } = useCurrentMembership();
  const { athleteId } = row;
  const ability = useAppAbility();
  const navigate = useNavigate();
  const [opening, setOpening] = useState(false);
  const cases = useCases(orgId, { athleteId, state: 'all' });
  const canOpen = ability.can('create', asSubject('Case', { id: '', organizationId: orgId, athleteId }));
  const open = (cases.data ?? []).filter((c) => !c.closedOn);
  const closed = (cases.data ?? []).filter((c) => c.closedOn);

  return (
    <>
      <AthleteHeader
        row={row}
        actions={
          canOpen &&
          !opening && (
            <Button onClick={() => setOpening(true)} variant="primary">
              Open a case
            </Button>
          )
        }
      >
        <span className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <StatusMark status={row.status} />
          <span className="tabular-nums">{row.statusEffectiveFrom ? `since ${formatDate(row.statusEffectiveFrom)}` : 'no open case'}</span>
          {row.nextReviewDate && <span className="tabular-nums">next review {formatDate(row.nextReviewDate)}</span>}
          {sportAndAge(row)}
          {row.isMinor && <Badge>Minor</Badge>}
        </span>
      </AthleteHeader>
      <ClinicalRecordCaution />

      {opening && (
        <Panel title="New case">
          <OpenCaseForm
            orgId={orgId}
            athleteId={athleteId}
            athleteName={row.athleteName}
            onCreated={(created) => navigate(clinicianCaseHref(created.id))}
            onCancel={() => setOpening(false)}
          />
        </Panel>
      )}

      {cases.isPending ? (
        <Loading what="cases" />
      ) : cases.isError ? (
        <ErrorNotice error={cases.error} />
      ) : (
        <>
          <Panel title="Open cases">
            <CaseList
              cases={open}
              caption={`Open cases of ${row.athleteName}`}
              empty="No open case. Open one when there is an injury or a problem to manage."
              caseHref={clinicianCaseHref}
            />
          </Panel>
          {closed.length > 0 && (
            <Panel title="Closed cases">
              <CaseList cases={closed} caption={`Closed cases of ${row.athleteName}`} empty="" caseHref={clinicianCaseHref} />
            </Panel>
          )}
        </>
      )}

      <PainReportList orgId={orgId} athleteId={athleteId} athleteName={row.athleteName} />

      <InForcePanel orgId={orgId} athleteId={athleteId} unit={user.unitPref} />

      <ClipsSection orgId={orgId} athleteId={athleteId} athleteName={row.athleteName} />

      <ClearanceLetters orgId={orgId} athleteId={athleteId} athleteName={row.athleteName} />
    </>
  );
}

const CLINICIAN_VIEW: AthleteView = {
  back: { to: '/clinician', label: 'My caseload' },
  notYours: 'Not in your caseload',
  Sections: ClinicianSections,
};
