import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useOrganization } from '../../../features/organization/api/get-organization';
import { PainReportForm } from '../../../features/pain-reports/components/PainReportForm';
import { PageHeader } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { RoleGate } from '../../layout/RoleGate';
import { ATHLETE_HOME } from './paths';

export function ReportPainPage() {
  useDocumentTitle('Report pain');
  return (
    <RoleGate role="athlete">
      <ReportPain />
    </RoleGate>
  );
}

function ReportPain() {
  const { orgId, membership } = useCurrentMembership();
  const organization = useOrganization(orgId);
  const number = organization.data?.emergencyNumber;
  const [sent, setSent] = useState(false);

  return (
    <div className="mx-auto max-w-xl space-y-5">
      {!sent && (
        <>
          <p className="text-sm">
            <Link to={ATHLETE_HOME}>← My page</Link>
          </p>
          <PageHeader title="Report pain">
            Where it hurts, how much, and a few questions about warning signs. About two minutes. Your care team is told as soon as you send
            it.
          </PageHeader>
          <p className="rounded-md border-2 border-line-deep bg-sheet px-4 py-3 text-sm">
            <span aria-hidden="true" className="mr-1 text-line-deep">
              ▲
            </span>
            Feeling very unwell, or a leg going weak or numb right now? Don&apos;t fill in a form: stop and get urgent care
            {number ? (
              <>
                {' '}
                — call{' '}
                <a href={`tel:${number.replace(/[^\d+]/g, '')}`} className="font-semibold tabular-nums">
                  {number}
                </a>
              </>
            ) : null}
            .
          </p>
        </>
      )}
      <PainReportForm
        orgId={orgId}
        athleteId={membership.id}
        emergencyNumber={number}
        homeHref={ATHLETE_HOME}
        onOutcome={() => setSent(true)}
        onKept={() => setSent(true)}
      />
    </div>
  );
}
