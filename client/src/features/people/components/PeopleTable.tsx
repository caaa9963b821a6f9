import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { PersonDto } from '../../../../../policies/dto';
import { DataTable } from '../../../components/ui/DataTable';
import { Badge } from '../../../components/ui/Panel';
import { careTeamSummary, rolesText } from './people-summary';

const column = createColumnHelper<PersonDto>();

/** Sorts people needing attention first: a minor without a guardian, then other minors. */
function flagRank(person: PersonDto): number {
  if (person.athlete?.needsGuardian) return 0;
  if (person.athlete?.isMinor) return 1;
  return 2;
}

export function PeopleTable({ people, personHref }: { people: PersonDto[]; personHref: (id: string) => string }) {
  const columns = useMemo(
    () => [
      column.accessor('displayName', {
        header: 'Name',
        cell: (info) => (
          <Link to={personHref(info.row.original.id)} className="font-semibold whitespace-nowrap">
            {info.getValue()}
          </Link>
        ),
      }),
      column.accessor('email', { header: 'E-mail' }),
      column.accessor((p) => rolesText(p), { id: 'roles', header: 'Roles' }),
      column.accessor((p) => flagRank(p), {
        id: 'flags',
        header: 'Minor',
        cell: (info) => {
          const athlete = info.row.original.athlete;
          if (!athlete?.isMinor) return <span className="text-muted">—</span>;
          return (
            <span className="flex flex-wrap gap-1">
              <Badge>Minor</Badge>
              {athlete.needsGuardian && <Badge tone="warn">Needs a guardian</Badge>}
            </span>
          );
        },
      }),
      column.accessor((p) => careTeamSummary(p, people), {
        id: 'careTeam',
        header: 'Care team',
        enableSorting: false,
        cell: (info) => <span className="text-ink-2">{info.getValue()}</span>,
      }),
    ],
    [people, personHref],
  );

  return (
    <DataTable
      data={people}
      columns={columns}
      caption="Everyone in the organization"
      hideCaption
      getRowId={(p) => p.id}
      filter={{
        label: 'Filter people',
        placeholder: 'Name, e-mail, role or sport',
        text: (p) => [p.displayName, p.email, rolesText(p), p.athlete?.sport ?? ''].join(' '),
      }}
      empty="Nobody has joined yet. Invite your first people from Invitations."
      noun={{ one: 'person', many: 'people' }}
      initialSorting={[{ id: 'displayName', desc: false }]}
    />
  );
}
