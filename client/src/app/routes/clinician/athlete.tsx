import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { asSubject } from '../../../../../policies/access';
import type { CaseloadRowDto } from '../../../../../policies/dto';
import { useCaseload } from '../../../features/caseload/api/get-caseload';
import { useCases } from '../../../features/cases/api/get-cases';
import { CaseList } from '../../../features/cases/components/CaseList';
import { OpenCaseForm } from '../../../features/cases/components/OpenCaseForm';
import { InForcePanel } from '../../../features/plans/components/InForcePanel';
import { ClearanceLetters } from '../../../features/letters/components/ClearanceLetters';
import { ClipsSection } from '../../../features/clips/components/ClipsSection';
import { ClinicalRecordCaution } from '../../../components/Cautions';
import { Button, ButtonLink } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Badge, Loading, PageHeader, Panel } from '../../../components/ui/Panel';
import { StatusMark } from '../../../components/ui/StatusMark';
import { useAppAbility } from '../../../lib/ability';
import { formatDate } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { clinicianCaseHref } from './paths';
import { staffWorkloadHref } from '../staff/paths';

export function ClinicianAthletePage() {
  const { athleteId = '' } = useParams();
  const { orgId } = useCurrentMembership();
  const caseload = useCaseload(orgId);
  const row = caseload.data?.find((r) => r.athleteId === athleteId);
  useDocumentTitle(row?.athleteName ?? 'Athlete');

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link to="/clinician">← My caseload</Link>
      </p>
      {caseload.isPending ? (
        <Loading what="this athlete" />
      ) : caseload.isError ? (
        <ErrorNotice error={caseload.error} />
      ) : !row ? (
        <Notice tone="problem" role="alert" title="Not in your caseload">
          <p>This athlete is not in your organization, or you are not on their care team.</p>
        </Notice>
      ) : (
        <AthleteCases athleteId={athleteId} row={row} />
      )}
    </div>
  );
}

function AthleteCases({ athleteId, row }: { athleteId: string; row: CaseloadRowDto }) {
  const { orgId, user } = useCurrentMembership();
  const ability = useAppAbility();
  const navigate = useNavigate();
  const [opening, setOpening] = useState(false);
  const cases = useCases(orgId, { athleteId, state: 'all' });
  const canOpen = ability.can('create', asSubject('Case', { id: '', organizationId: orgId, athleteId }));
  const open = (cases.data ?? []).filter((c) => !c.closedOn);
  const closed = (cases.data ?? []).filter((c) => c.closedOn);

  return (
    <>
      <PageHeader
        title={row.athleteName}
        actions={
          <>
            <ButtonLink to={staffWorkloadHref(athleteId)} variant="secondary">
              Workload and pain
            </ButtonLink>
            {canOpen && !opening && (
              <Button onClick={() => setOpening(true)} variant="primary">
                Open a case
              </Button>
            )}
          </>
        }
      >
        <span className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <StatusMark status={row.status} />
          <span className="tabular-nums">{row.statusEffectiveFrom ? `since ${formatDate(row.statusEffectiveFrom)}` : 'no open case'}</span>
          {row.nextReviewDate && <span className="tabular-nums">next review {formatDate(row.nextReviewDate)}</span>}
          {[row.sport, row.age !== null ? `${row.age} years` : null].filter(Boolean).join(' · ')}
          {row.isMinor && <Badge>Minor</Badge>}
        </span>
      </PageHeader>
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

      <InForcePanel orgId={orgId} athleteId={athleteId} unit={user.unitPref} />

      <ClipsSection orgId={orgId} athleteId={athleteId} athleteName={row.athleteName} />

      <ClearanceLetters orgId={orgId} athleteId={athleteId} athleteName={row.athleteName} />
    </>
  );
}
