import { Link, useParams } from 'react-router-dom';
import { asSubject } from '../../../../../policies/access';
import type { CaseDetailDto } from '../../../../../policies/dto';
import { useCase } from '../../../features/cases/api/get-case';
import { useCases } from '../../../features/cases/api/get-cases';
import { CaseDetails } from '../../../features/cases/components/CaseDetails';
import { ChangeStatusForm } from '../../../features/cases/components/ChangeStatusForm';
import { CloseCaseForm } from '../../../features/cases/components/CloseCaseForm';
import { StatusTimeline } from '../../../features/cases/components/StatusTimeline';
import { regionsText } from '../../../features/cases/components/case-words';
import { InForcePanel } from '../../../features/plans/components/InForcePanel';
import { ClearanceLetters } from '../../../features/letters/components/ClearanceLetters';
import { CaseFhirExport } from '../../../features/case-export/components/CaseFhirExport';
import { PlanSection } from '../../../features/plans/components/PlanSection';
import { CaseDocuments } from '../../../features/documents/components/CaseDocuments';
import { ClinicalRecordCaution } from '../../../components/Cautions';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, PageHeader, Panel } from '../../../components/ui/Panel';
import { StatusMark } from '../../../components/ui/StatusMark';
import { useAppAbility } from '../../../lib/ability';
import { orgDayOf } from '../../../lib/dates';
import { formatDate, formatDateTime } from '../../../lib/format';
import { painReportHref } from '../../../lib/pain-report-href';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { clinicianAthleteHref } from './paths';

export function ClinicianCasePage() {
  const { caseId = '' } = useParams();
  const { orgId } = useCurrentMembership();
  const detail = useCase(orgId, caseId);
  useDocumentTitle(detail.data ? `Case: ${detail.data.athleteName}` : 'Case');

  if (detail.isPending) return <Loading what="the case" />;
  if (detail.isError) {
    return (
      <div className="space-y-4">
        <p className="text-sm">
          <Link to="/clinician">← My caseload</Link>
        </p>
        <ErrorNotice error={detail.error} wording={{ notFound: 'This case does not exist, or it is not one of your athletes’.' }} />
      </div>
    );
  }
  return <CaseScreen detail={detail.data} />;
}

function CaseScreen({ detail }: { detail: CaseDetailDto }) {
  const { orgId, user } = useCurrentMembership();
  const ability = useAppAbility();
  const cases = useCases(orgId, { athleteId: detail.athleteId, state: 'all' });
  const scope = { organizationId: detail.organizationId, athleteId: detail.athleteId };
  const canUpdate = ability.can('update', asSubject('Case', { id: detail.id, ...scope }));
  const canSetStatus = canUpdate && ability.can('create', asSubject('ParticipationStatus', scope));
  const canCreatePlan = ability.can('create', asSubject('RestrictionPlan', { id: '', ...scope }));
  const canUpdatePlan = ability.can('update', asSubject('RestrictionPlan', { id: detail.planId ?? '', ...scope }));
  const canExport = ability.can('read', asSubject('CaseExport', scope));
  const open = !detail.closedOn;
  const copySources = (cases.data ?? [])
    .filter((c) => c.id !== detail.id && c.planId)
    .map((c) => ({
      planId: c.planId!,
      label: `${regionsText(c.bodyRegions)} (opened ${formatDate(orgDayOf(c.openedAt))}${c.closedOn ? `, closed ${formatDate(c.closedOn)}` : ''})`,
    }));

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link to={clinicianAthleteHref(detail.athleteId)}>← {detail.athleteName}</Link>
      </p>
      <PageHeader title={`Case: ${regionsText(detail.bodyRegions)}`}>
        <span className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <span className="font-semibold text-ink">{detail.athleteName}</span>
          <StatusMark status={detail.status} />
          <span className="tabular-nums">from {formatDate(detail.statusEffectiveFrom)}</span>
          {detail.closedOn && <span className="font-semibold">Closed {formatDate(detail.closedOn)}</span>}
        </span>
        {detail.painReports?.map((r) => (
          <span key={r.id} className="mt-1 block">
            From <Link to={painReportHref(r.id)}>the pain report of {formatDateTime(r.reportedAt)}</Link>
          </span>
        ))}
      </PageHeader>
      <ClinicalRecordCaution />

      {detail.closedOn && (
        <Notice tone="info" title={`This case was closed on ${formatDate(detail.closedOn)}`}>
          {detail.closingNote && <p>“{detail.closingNote}”</p>}
          <p>Its plan is no longer in force, and nothing on it can change. A new problem gets a new case.</p>
        </Notice>
      )}

      <div className="grid gap-5 lg:grid-cols-2">
        <Panel title="Case details">
          <CaseDetails orgId={orgId} detail={detail} canEdit={canUpdate} />
        </Panel>
        <Panel title="Participation status">
          <div className="space-y-5">
            {canSetStatus && open && <ChangeStatusForm orgId={orgId} detail={detail} />}
            <div>
              <h3 className="mb-2 text-sm font-semibold">History</h3>
              <StatusTimeline history={detail.statusHistory ?? []} />
            </div>
          </div>
        </Panel>
      </div>

      <Panel title="Restriction plan">
        <PlanSection
          orgId={orgId}
          caseId={detail.id}
          planId={detail.planId ?? null}
          unit={user.unitPref}
          closed={!open}
          canCreate={canCreatePlan}
          canUpdate={canUpdatePlan}
          copySources={copySources}
        />
      </Panel>

      <CaseDocuments
        orgId={orgId}
        caseId={detail.id}
        athleteId={detail.athleteId}
        athleteName={detail.athleteName}
        audience="clinician"
        closed={!open}
      />

      <InForcePanel orgId={orgId} athleteId={detail.athleteId} unit={user.unitPref} />

      <ClearanceLetters orgId={orgId} athleteId={detail.athleteId} athleteName={detail.athleteName} />

      {canExport && <CaseFhirExport orgId={orgId} caseId={detail.id} />}

      {canUpdate && open && (
        <Panel title="Close the case">
          <CloseCaseForm orgId={orgId} detail={detail} />
        </Panel>
      )}
    </div>
  );
}
