import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import type { PainReportOutcomeDto } from '../../../../../policies/dto';
import { renderWithProviders } from '../../../test/render';
import { EMERGENCY_HEADING, ROUTINE_HEADING, ReportOutcome } from './ReportOutcome';

function outcome(over: Partial<PainReportOutcomeDto>): PainReportOutcomeDto {
  return {
    report: {
      id: 'r1',
      organizationId: 'org-1',
      athleteId: 'a1',
      athleteName: 'Maya Torres',
      reportedAt: '2026-03-05T18:00:00.000Z',
      bodyRegions: ['lower_back'],
      painNow: 6,
      painWorst24h: 7,
      onsetDate: '2026-03-05',
      aggravatingPatterns: ['hinge'],
      startedInTraining: true,
      route: 'routine',
      caseId: null,
    },
    route: 'routine',
    statusSetToOut: false,
    message: 'Thanks — your care team has been told.',
    emergencyNumber: '911',
    ...over,
  };
}

describe('ReportOutcome', () => {
  it('puts the stop-and-get-care instruction first, with the emergency number as a link that dials, and says the athlete is Out', () => {
    renderWithProviders(
      <ReportOutcome
        outcome={outcome({
          route: 'emergency',
          statusSetToOut: true,
          emergencyNumber: '9-1-1',
          message: 'Stop training now and get urgent medical care.',
        })}
        homeHref="/athlete"
      />,
    );
    const headings = screen.getAllByRole('heading');
    expect(headings[0]).toHaveTextContent(EMERGENCY_HEADING);
    expect(headings[0]).toHaveFocus();
    const dialog = screen.getByRole('dialog', { name: EMERGENCY_HEADING });
    // The call link is the first control on the screen.
    const firstControl = dialog.querySelector('a, button');
    expect(firstControl).toHaveAttribute('href', 'tel:911');
    expect(firstControl).toHaveTextContent('Call 9-1-1');
    expect(screen.getByRole('img', { name: /Participation status: Out/ })).toBeInTheDocument();
  });

  it('tells a routine report what happens next', () => {
    renderWithProviders(<ReportOutcome outcome={outcome({})} homeHref="/athlete" />);
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent(ROUTINE_HEADING);
    expect(screen.getByRole('heading', { name: 'What happens next' })).toBeInTheDocument();
    expect(screen.queryByText(EMERGENCY_HEADING)).not.toBeInTheDocument();
  });

  it('asks an urgent report to contact the clinician today', () => {
    renderWithProviders(
      <ReportOutcome outcome={outcome({ route: 'urgent', message: 'Please contact your clinician today.' })} homeHref="/athlete" />,
    );
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent('Contact your clinician today');
  });
});
