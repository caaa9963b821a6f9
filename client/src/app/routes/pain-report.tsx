import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { asSubject } from '../../../../policies/access';
import type { PainReportDto } from '../../../../policies/dto';
import { usePainReport } from '../../features/pain-reports/api/get-pain-report';
import { PainReportDetails } from '../../features/pain-reports/components/PainReportDetails';
import { OpenCaseForm } from '../../features/cases/components/OpenCaseForm';
import { ClinicalRecordCaution } from '../../components/Cautions';
import { Button } from '../../components/ui/Button';
import { ErrorNotice } from '../../components/ui/Notice';
import { Loading, PageHeader, Panel } from '../../components/ui/Panel';
import { useAppAbility } from '../../lib/ability';
import { formatDateTime } from '../../lib/format';
import { useCurrentMembership, type CurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';
import { clinicianAthleteHref, clinicianCaseHref } from './clinician/paths';
import { coachAthleteHref } from './coach';

/**
 * One pain report for everyone who may read it: the athlete, and their care team's clinicians (all of
 * it) and coaches (no note, no answers — the server leaves them out). Anyone else gets "not found".
 */
export function PainReportPage() {
  const { reportId = '' } = useParams();
  const { orgId } = useCurrentMembership();
  const detail = usePainReport(orgId, reportId);
  useDocumentTitle(detail.data ? `Pain report: ${detail.data.report.athleteName}` : 'Pain report');

  if (detail.isPending) return <Loading what="the pain report" />;
  if (detail.isError) {
    return <ErrorNotice error={detail.error} wording={{ notFound: 'This pain report does not exist, or it is not one you may read.' }} />;
  }
  return <PainReportScreen detail={detail.data} />;
}

function backLink(current: CurrentMembership, report: PainReportDto): { to: string; label: string } {
  const { actor } = current.membership;
  if (actor.clinicianOf.includes(report.athleteId)) return { to: clinicianAthleteHref(report.athleteId), label: report.athleteName };
  if (actor.coachOf.includes(report.athleteId)) return { to: coachAthleteHref(report.athleteId), label: report.athleteName };
  return { to: '/athlete', label: 'My page' };
}

function PainReportScreen({ detail }: { detail: Parameters<typeof PainReportDetails>[0]['detail'] }) {
  const current = useCurrentMembership();
  const { orgId } = current;
  const { report } = detail;
  const ability = useAppAbility();
  const navigate = useNavigate();
  const [opening, setOpening] = useState(false);
  const back = backLink(current, report);
  const clinician = ability.can('create', asSubject('Case', { id: '', organizationId: orgId, athleteId: report.athleteId }));

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link to={back.to}>← {back.label}</Link>
      </p>
      <PageHeader
        title={`Pain report: ${report.athleteName}`}
        actions={
          clinician && !report.caseId && !opening ? (
            <Button variant="primary" onClick={() => setOpening(true)}>
              Open a case from this report
            </Button>
          ) : undefined
        }
      >
        <span className="block tabular-nums">Filed {formatDateTime(report.reportedAt)}</span>
        {clinician && report.caseId && (
          <span className="mt-1 block">
            This report belongs to a case: <Link to={clinicianCaseHref(report.caseId)}>open the case</Link>.
          </span>
        )}
      </PageHeader>
      {clinician && <ClinicalRecordCaution />}

      {opening && (
        <Panel title="New case from this report">
          <OpenCaseForm
            orgId={orgId}
            athleteId={report.athleteId}
            athleteName={report.athleteName}
            fromReport={{ id: report.id, reportedAt: report.reportedAt, bodyRegions: report.bodyRegions, onsetDate: report.onsetDate }}
            onCreated={(created) => navigate(clinicianCaseHref(created.id))}
            onCancel={() => setOpening(false)}
          />
        </Panel>
      )}

      <PainReportDetails detail={detail} />
    </div>
  );
}
