import type { ComponentType, ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { CaseloadRowDto } from '../../../../../policies/dto';
import { useCaseload } from '../../../features/caseload/api/get-caseload';
import { ButtonLink } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { staffWorkloadHref } from './paths';

/**
 * What one role's page for an athlete adds to the shared frame. The view is chosen by the page's
 * address (/coach/… or /clinician/…), not by the person's roles: someone who is both coach and
 * clinician sees the coach's page on the coach's address.
 */
export interface AthleteView {
  /** The link back to the list this page was opened from. */
  back: { to: string; label: string };
  /** The notice's title when the athlete is not one of this person's. */
  notYours: string;
  /** The role's own sections, from the page header down. */
  Sections: ComponentType<{ row: CaseloadRowDto }>;
}

/**
 * One athlete for a member of their care team. The caseload row (the server's answer, already
 * limited to this person's athletes) is the page's source: an athlete not in it is not theirs.
 */
export function StaffAthletePage({ view }: { view: AthleteView }) {
  const { athleteId = '' } = useParams();
  const { orgId } = useCurrentMembership();
  const caseload = useCaseload(orgId);
  const row = caseload.data?.find((r) => r.athleteId === athleteId);
  useDocumentTitle(row?.athleteName ?? 'Athlete');
  const { Sections } = view;

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link to={view.back.to}>← {view.back.label}</Link>
      </p>
      {caseload.isPending ? (
        <Loading what="this athlete" />
      ) : caseload.isError ? (
        <ErrorNotice error={caseload.error} />
      ) : !row ? (
        <Notice tone="problem" role="alert" title={view.notYours}>
          <p>This athlete is not in your organization, or you are not on their care team.</p>
        </Notice>
      ) : (
        <Sections row={row} />
      )}
    </div>
  );
}

/** "Softball · 16 years": what the page header says of the athlete, leaving out what is unknown. */
export function sportAndAge(row: CaseloadRowDto): string {
  return [row.sport, row.age !== null ? `${row.age} years` : null].filter(Boolean).join(' · ');
}

/** The athlete's name, the role's summary under it, and the workload link every staff role has. */
export function AthleteHeader({ row, actions, children }: { row: CaseloadRowDto; actions?: ReactNode; children: ReactNode }) {
  return (
    <PageHeader
      title={row.athleteName}
      actions={
        <>
          <ButtonLink to={staffWorkloadHref(row.athleteId)} variant="secondary">
            Workload and pain
          </ButtonLink>
          {actions}
        </>
      }
    >
      {children}
    </PageHeader>
  );
}
