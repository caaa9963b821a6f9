import { Link } from 'react-router-dom';
import { BODY_REGION_LABELS } from '../../../../../policies/body-regions';
import { useCheckIns } from '../../../features/check-ins/api/get-check-ins';
import { ComingWeek } from '../../../features/programs/components/ComingWeek';
import { useWeek } from '../../../features/programs/api/get-week';
import { LastUpdatedNote } from '../../../features/offline/components/LastUpdatedNote';
import { OutboxPanel } from '../../../features/offline/components/OutboxPanel';
import { CheckInList } from '../../../features/check-ins/components/CheckInList';
import { usePainReports } from '../../../features/pain-reports/api/get-pain-reports';
import { useTrainingLogs } from '../../../features/training-logs/api/get-training-logs';
import { LogList } from '../../../features/training-logs/components/LogList';
import { useWorkload } from '../../../features/workload/api/get-workload';
import { WeeklyLoadChart } from '../../../features/workload/components/LoadCharts';
import { PainLoadChart } from '../../../features/workload/components/PainLoadChart';
import { ButtonLink } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, PageHeader, Panel } from '../../../components/ui/Panel';
import { addDaysIso, orgDayOf, todayLocal } from '../../../lib/dates';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { RoleGate } from '../../layout/RoleGate';
import { ATHLETE_CHECK_IN, ATHLETE_CLIPS, ATHLETE_HOME, ATHLETE_LOG, athleteLogSessionHref, athleteNewClipHref } from './paths';

/** Two weeks of sessions and check-ins; the weekly chart looks back four weeks. */
const DAYS = 14;
const CHART_DAYS = 28;

export function MyWeekPage() {
  useDocumentTitle('My week');
  return (
    <RoleGate role="athlete">
      <MyWeek />
    </RoleGate>
  );
}

function MyWeek() {
  const { orgId, membership, user } = useCurrentMembership();
  const today = todayLocal();
  const range = { from: addDaysIso(today, -(DAYS - 1)), to: today };
  const logs = useTrainingLogs(orgId, membership.id, range);
  const checkIns = useCheckIns(orgId, membership.id, range);
  const workload = useWorkload(orgId, membership.id, today, CHART_DAYS);
  const reports = usePainReports(orgId, membership.id);
  const week = useWeek(orgId, membership.id, today);
  const recentReports = (reports.data ?? []).filter((r) => orgDayOf(r.reportedAt) >= range.from);

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <p className="text-sm">
        <Link to={ATHLETE_HOME}>← My page</Link>
      </p>
      <PageHeader title="My week">
        The coming seven days, then your last two weeks: sessions, how the pain responded, and your check-ins. Your coach and clinician see
        the same numbers.
      </PageHeader>
      <LastUpdatedNote queries={[week, logs, checkIns, workload, reports]} />
      <OutboxPanel />
      <div className="flex flex-col gap-2 sm:flex-row">
        <ButtonLink to={ATHLETE_LOG} variant="primary" size="lg">
          Log a session
        </ButtonLink>
        <ButtonLink to={ATHLETE_CHECK_IN} size="lg">
          Check in
        </ButtonLink>
        <ButtonLink to={ATHLETE_CLIPS} size="lg">
          My clips
        </ButtonLink>
      </div>

      <ComingWeek
        orgId={orgId}
        athleteId={membership.id}
        today={today}
        logHref={athleteLogSessionHref}
        loggedSessionIds={new Set((logs.data ?? []).flatMap((l) => (l.sessionId ? [l.sessionId] : [])))}
      />

      {workload.isPending ? (
        <Loading what="your charts" />
      ) : workload.isError && !workload.data ? (
        <ErrorNotice error={workload.error} title="Charts not available" />
      ) : (
        <PainLoadChart pain={workload.data.pain.filter((p) => p.date >= range.from)} />
      )}

      <Panel title="Sessions">
        <p className="mb-3 text-sm text-ink-2">Each bar is the pain during a session; the orange mark is the ceiling your clinician set.</p>
        {logs.isPending ? (
          <Loading what="your sessions" />
        ) : logs.isError && !logs.data ? (
          <ErrorNotice error={logs.error} />
        ) : (
          <LogList
            logs={logs.data}
            unit={user.unitPref}
            empty="No sessions logged in the last two weeks."
            actions={(log) =>
              log.sets.length > 0 && (
                <ButtonLink to={athleteNewClipHref(log.id)} size="md" aria-label={`Add a clip to the session of ${formatDate(log.date)}`}>
                  Add a clip
                </ButtonLink>
              )
            }
          />
        )}
      </Panel>

      {workload.isSuccess && <WeeklyLoadChart weeks={workload.data.weeks} />}

      <Panel title="Check-ins">
        {checkIns.isPending ? (
          <Loading what="your check-ins" />
        ) : checkIns.isError && !checkIns.data ? (
          <ErrorNotice error={checkIns.error} />
        ) : (
          <CheckInList checkIns={checkIns.data} empty="No check-ins in the last two weeks." />
        )}
      </Panel>

      <Panel title="Pain reports">
        {reports.isPending ? (
          <Loading what="your reports" />
        ) : reports.isError && !reports.data ? (
          <ErrorNotice error={reports.error} />
        ) : recentReports.length === 0 ? (
          <p className="text-sm text-ink-2">No pain reports in the last two weeks.</p>
        ) : (
          <ul className="space-y-2">
            {recentReports.map((r) => (
              <li key={r.id} className="rounded-md border border-rule px-3 py-2 text-sm">
                <span className="font-semibold">{r.bodyRegions.map((b) => BODY_REGION_LABELS[b]).join(', ')}</span>
                <span className="block text-ink-2 tabular-nums">
                  {formatDateTime(r.reportedAt)} · pain {r.painNow}/10, worst {r.painWorst24h}/10
                </span>
              </li>
            ))}
          </ul>
        )}
      </Panel>
    </div>
  );
}
