import { describe, expect, it } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import type { AthleteProfileDto, PersonDto } from '../../../../../policies/dto';
import { renderWithProviders } from '../../../test/render';
import { PeopleTable } from './PeopleTable';

function athlete(id: string, over: Partial<AthleteProfileDto> = {}): AthleteProfileDto {
  return {
    id,
    organizationId: 'o',
    displayName: id,
    dateOfBirth: null,
    age: null,
    isMinor: false,
    needsGuardian: false,
    sport: null,
    position: null,
    version: 1,
    careTeam: [],
    guardians: [],
    ...over,
  };
}

function person(id: string, name: string, over: Partial<PersonDto> = {}): PersonDto {
  return {
    id,
    organizationId: 'o',
    userId: `u-${id}`,
    email: `${id}@x.test`,
    displayName: name,
    roles: ['coach'],
    version: 1,
    createdAt: '2025-01-01T00:00:00.000Z',
    athlete: null,
    ...over,
  };
}

const PEOPLE: PersonDto[] = [
  person('theo', 'Theo Lindqvist'),
  person('maya', 'Maya Torres', {
    roles: ['athlete'],
    athlete: athlete('maya', {
      isMinor: true,
      needsGuardian: true,
      sport: 'Softball',
      careTeam: [
        {
          id: 'c1',
          organizationId: 'o',
          athleteId: 'maya',
          athleteName: 'Maya Torres',
          memberId: 'theo',
          memberName: 'Theo Lindqvist',
          memberEmail: 'theo.lindqvist@harborpoint.example',
          role: 'coach',
        },
      ],
    }),
  }),
  person('ana', 'Ana Admin', { roles: ['admin'] }),
];

describe('PeopleTable', () => {
  it('lists people by name with links, roles, the minor flag and care teams', () => {
    renderWithProviders(<PeopleTable people={PEOPLE} personHref={(id) => `/admin/people/${id}`} />);
    const rows = screen.getAllByRole('row').slice(1);
    expect(rows.map((r) => within(r).getAllByRole('cell')[0].textContent)).toEqual(['Ana Admin', 'Maya Torres', 'Theo Lindqvist']);
    expect(screen.getByRole('link', { name: 'Maya Torres' })).toHaveAttribute('href', '/admin/people/maya');
    const maya = rows[1];
    expect(within(maya).getByText('Minor')).toBeInTheDocument();
    expect(within(maya).getByText('Needs a guardian')).toBeInTheDocument();
    expect(within(maya).getByText('Theo Lindqvist (coach)')).toBeInTheDocument();
    expect(within(rows[2]).getByText('On 1 care team')).toBeInTheDocument();
  });

  it('filters by any text and sorts when a header is pressed', () => {
    renderWithProviders(<PeopleTable people={PEOPLE} personHref={(id) => `/p/${id}`} />);
    fireEvent.change(screen.getByLabelText('Filter people'), { target: { value: 'softball' } });
    expect(screen.getAllByRole('row')).toHaveLength(2);
    expect(screen.getByText('Showing 1 of 3 people')).toBeInTheDocument();

    fireEvent.change(screen.getByLabelText('Filter people'), { target: { value: '' } });
    const nameHeader = screen.getByRole('columnheader', { name: /Name/ });
    expect(nameHeader).toHaveAttribute('aria-sort', 'ascending');
    fireEvent.click(within(nameHeader).getByRole('button'));
    expect(nameHeader).toHaveAttribute('aria-sort', 'descending');
    expect(within(screen.getAllByRole('row')[1]).getAllByRole('cell')[0]).toHaveTextContent('Theo Lindqvist');
  });
});
