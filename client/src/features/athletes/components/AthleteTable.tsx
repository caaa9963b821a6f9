import { useMemo } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import { ROLE_LABELS } from '../../../../../policies/roles';
import { DataTable } from '../../../components/ui/DataTable';
import { Badge } from '../../../components/ui/Panel';

const column = createColumnHelper<AthleteProfileDto>();

function sportText(a: AthleteProfileDto): string {
  return [a.sport, a.position].filter(Boolean).join(', ');
}

/** The dense roster view for coaches and clinicians. */
export function AthleteTable({ athletes, caption, empty }: { athletes: AthleteProfileDto[]; caption: string; empty: string }) {
  const columns = useMemo(
    () => [
      column.accessor('displayName', {
        header: 'Name',
        cell: (info) => <span className="font-semibold">{info.getValue()}</span>,
      }),
      column.accessor('age', {
        header: 'Age',
        sortUndefined: 'last',
        cell: (info) => <span className="tabular-nums">{info.getValue() ?? '—'}</span>,
      }),
      column.accessor((a) => sportText(a), {
        id: 'sport',
        header: 'Sport',
        cell: (info) => info.getValue() || <span className="text-muted">—</span>,
      }),
      column.accessor((a) => (a.needsGuardian ? 0 : a.isMinor ? 1 : 2), {
        id: 'minor',
        header: 'Minor',
        cell: (info) => {
          const a = info.row.original;
          if (!a.isMinor) return <span className="text-muted">—</span>;
          return (
            <span className="flex flex-wrap gap-1">
              <Badge>Minor</Badge>
              {a.needsGuardian && <Badge tone="warn">No guardian linked</Badge>}
            </span>
          );
        },
      }),
      column.accessor((a) => a.careTeam.map((m) => `${m.memberName} (${ROLE_LABELS[m.role].toLowerCase()})`).join(', '), {
        id: 'careTeam',
        header: 'Care team',
        enableSorting: false,
        cell: (info) => <span className="text-ink-2">{info.getValue() || '—'}</span>,
      }),
    ],
    [],
  );

  return (
    <DataTable
      data={athletes}
      columns={columns}
      caption={caption}
      hideCaption
      getRowId={(a) => a.id}
      filter={
        athletes.length > 8
          ? { label: 'Filter athletes', text: (a) => `${a.displayName} ${sportText(a)}`, placeholder: 'Name or sport' }
          : undefined
      }
      empty={empty}
      noun={{ one: 'athlete', many: 'athletes' }}
      initialSorting={[{ id: 'displayName', desc: false }]}
    />
  );
}
