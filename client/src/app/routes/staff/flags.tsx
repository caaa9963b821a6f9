import { useState } from 'react';
import { useFlags, type FlagState } from '../../../features/flags/api/get-flags';
import { FlagList } from '../../../features/flags/components/FlagList';
import { SelectField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { StaffGate } from './StaffGate';
import { staffWorkloadHref } from './paths';

const STATES: { value: FlagState; label: string }[] = [
  { value: 'open', label: 'Not yet acknowledged' },
  { value: 'acknowledged', label: 'Acknowledged' },
  { value: 'all', label: 'All' },
];

export function StaffFlagsPage() {
  useDocumentTitle('Flags');
  return (
    <StaffGate>
      <Flags />
    </StaffGate>
  );
}

function Flags() {
  const { orgId } = useCurrentMembership();
  const [state, setState] = useState<FlagState>('open');
  const flags = useFlags(orgId, { state });

  return (
    <div className="space-y-5">
      <PageHeader
        title="Flags"
        actions={
          <SelectField label="Show" value={state} onChange={(e) => setState(e.target.value as FlagState)} className="w-56">
            {STATES.map((s) => (
              <option key={s.value} value={s.value}>
                {s.label}
              </option>
            ))}
          </SelectField>
        }
      >
        Pain reports, warning signs and pain-rule responses of the athletes on your care teams, newest first. Acknowledge a flag to tell the
        rest of the care team you have seen it.
      </PageHeader>
      {flags.isPending ? (
        <Loading what="flags" />
      ) : flags.isError ? (
        <ErrorNotice error={flags.error} />
      ) : (
        <FlagList orgId={orgId} flags={flags.data} athleteHref={staffWorkloadHref} caption="Flags for your athletes" />
      )}
    </div>
  );
}
