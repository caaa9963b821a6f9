import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useCaseload } from '../../../features/caseload/api/get-caseload';
import { useWorkload } from '../../../features/workload/api/get-workload';
import { E1rmChart } from '../../../features/workload/components/E1rmChart';
import { DailyLoadChart, WeeklyLoadChart } from '../../../features/workload/components/LoadCharts';
import { PainLoadChart } from '../../../features/workload/components/PainLoadChart';
import { AcuteChronicNote, WeekTable } from '../../../features/workload/components/WeekTable';
import { SelectField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { todayLocal } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { clinicianAthleteHref } from '../clinician/paths';
import { coachAthleteHref } from '../coach';
import { StaffGate } from './StaffGate';

const RANGES = [
  { days: 28, label: 'Last 4 weeks' },
  { days: 56, label: 'Last 8 weeks' },
  { days: 84, label: 'Last 12 weeks' },
] as const;

/** The athlete's page this one came from: the clinical one for their clinician, else the coaching one. */
function backHref(athleteId: string, clinicianOf: readonly string[]): string {
  return clinicianOf.includes(athleteId) ? clinicianAthleteHref(athleteId) : coachAthleteHref(athleteId);
}

export function StaffWorkloadPage() {
  useDocumentTitle('Workload');
  return (
    <StaffGate>
      <AthleteWorkload />
    </StaffGate>
  );
}

function AthleteWorkload() {
  const { athleteId = '' } = useParams();
  const { orgId, membership, user } = useCurrentMembership();
  const [days, setDays] = useState<number>(56);
  const today = todayLocal();
  const caseload = useCaseload(orgId);
  const workload = useWorkload(orgId, athleteId, today, days);
  const name = caseload.data?.find((r) => r.athleteId === athleteId)?.athleteName;

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link to={backHref(athleteId, membership.actor.clinicianOf)}>← {name ?? 'Athlete'}</Link>
      </p>
      <PageHeader
        title="Workload"
        actions={
          <SelectField label="Period" value={days} onChange={(e) => setDays(Number(e.target.value))} className="w-44">
            {RANGES.map((r) => (
              <option key={r.days} value={r.days}>
                {r.label}
              </option>
            ))}
          </SelectField>
        }
      >
        <span className="font-semibold text-ink">{name ?? 'This athlete'}</span>
        {workload.data && (
          <span className="tabular-nums">
            {' '}
            · {formatDate(workload.data.from)} – {formatDate(workload.data.to)}
          </span>
        )}
        <span className="block">
          Session load is session effort (0–10) × minutes, in arbitrary units (Foster et al. 2001). These numbers describe training; they do
          not predict injury.
        </span>
      </PageHeader>

      {workload.isPending ? (
        <Loading what="the workload" />
      ) : workload.isError ? (
        <ErrorNotice error={workload.error} wording={{ notFound: 'This athlete is not in your organization, or not on your care team.' }} />
      ) : (
        <>
          <AcuteChronicNote acuteChronic={workload.data.acuteChronic} />
          <DailyLoadChart daily={workload.data.daily} stages={workload.data.stages} />
          <div className="grid gap-5 lg:grid-cols-2 [&>*]:min-w-0">
            <WeeklyLoadChart weeks={workload.data.weeks} />
            <WeekTable weeks={workload.data.weeks} />
          </div>
          <PainLoadChart pain={workload.data.pain} />
          <E1rmChart e1rm={workload.data.e1rm} unit={user.unitPref} />
        </>
      )}
    </div>
  );
}
