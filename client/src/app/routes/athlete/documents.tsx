import { Link } from 'react-router-dom';
import type { CaseDto } from '../../../../../policies/dto';
import { useCases } from '../../../features/cases/api/get-cases';
import { regionsText } from '../../../features/cases/components/case-words';
import { CaseDocuments } from '../../../features/documents/components/CaseDocuments';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { formatDate } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { RoleGate } from '../../layout/RoleGate';
import { ATHLETE_HOME } from './paths';

export function MyDocumentsPage() {
  useDocumentTitle('My documents');
  return (
    <RoleGate role="athlete">
      <MyDocuments />
    </RoleGate>
  );
}

const caseTitle = (c: CaseDto) =>
  `${c.bodyRegions?.length ? regionsText(c.bodyRegions) : 'Case'}${c.closedOn ? ` (closed ${formatDate(c.closedOn)})` : ''}`;

/** The athlete's own cases, each with the outside documents on it: open cases first, then closed ones. */
function MyDocuments() {
  const { orgId, membership, user } = useCurrentMembership();
  const cases = useCases(orgId, { athleteId: membership.id, state: 'all' });
  const ordered = [...(cases.data ?? [])].sort(
    (a, b) => Number(!!a.closedOn) - Number(!!b.closedOn) || b.openedAt.localeCompare(a.openedAt),
  );
  return (
    <div className="mx-auto max-w-xl space-y-5">
      <p className="text-sm">
        <Link to={ATHLETE_HOME}>← My page</Link>
      </p>
      <PageHeader title="My documents">
        Papers from outside Loadline for your clinician: a doctor&apos;s note, a scan report, a referral. Each belongs to one of your cases.
      </PageHeader>
      {cases.isPending ? (
        <Loading what="your cases" />
      ) : cases.isError ? (
        <ErrorNotice error={cases.error} />
      ) : ordered.length === 0 ? (
        <p className="rounded-lg border border-rule bg-sheet p-4 text-sm">
          You have no case open. Documents are added to a case, which your clinician opens when there is an injury to manage.
        </p>
      ) : (
        ordered.map((c) => (
          <CaseDocuments
            key={c.id}
            orgId={orgId}
            caseId={c.id}
            athleteId={membership.id}
            athleteName={user.displayName}
            audience="athlete"
            title={`Documents: ${caseTitle(c)}`}
            closed={!!c.closedOn}
          />
        ))
      )}
    </div>
  );
}
