import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import { AthleteCard } from './AthleteCard';

const member = (id: string, name: string, email: string, role: 'coach' | 'clinician') => ({
  id,
  organizationId: 'o1',
  athleteId: 'm-maya',
  athleteName: 'Maya Torres',
  memberId: `m-${id}`,
  memberName: name,
  memberEmail: email,
  role,
});

const MAYA: AthleteProfileDto = {
  id: 'm-maya',
  organizationId: 'o1',
  displayName: 'Maya Torres',
  dateOfBirth: '2010-03-14',
  age: 16,
  isMinor: true,
  needsGuardian: false,
  sport: 'Softball',
  position: 'Shortstop',
  version: 1,
  careTeam: [
    member('theo', 'Theo Lindqvist', 'theo.lindqvist@harborpoint.example', 'coach'),
    member('priya', 'Priya Raman', 'priya.raman@harborpoint.example', 'clinician'),
  ],
  guardians: [],
};

describe('the athlete card', () => {
  it('each member of the care team can be e-mailed from it, so "contact your clinician" is something to do here', () => {
    render(<AthleteCard athlete={MAYA} self />);
    expect(screen.getByRole('link', { name: 'E-mail Priya Raman: priya.raman@harborpoint.example' })).toHaveAttribute(
      'href',
      'mailto:priya.raman@harborpoint.example',
    );
    expect(screen.getByRole('link', { name: /^E-mail Theo Lindqvist/ })).toHaveAttribute(
      'href',
      'mailto:theo.lindqvist@harborpoint.example',
    );
  });
});
