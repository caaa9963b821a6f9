import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import type { PainReportDetailDto, PainReportDto } from '../../../../../policies/dto';
import { RED_FLAG_ITEMS, redFlagQuestion } from '../../../../../policies/red-flags';
import { renderWithProviders } from '../../../test/render';
import { PainReportDetails } from './PainReportDetails';
import { answerRows } from './report-reading';

const coachCopy: PainReportDto = {
  id: 'r1',
  organizationId: 'o1',
  athleteId: 'a1',
  athleteName: 'Maya Torres',
  reportedAt: '2026-03-05T18:00:00.000Z',
  bodyRegions: ['lower_back'],
  painNow: 5,
  painWorst24h: 7,
  onsetDate: '2026-03-03',
  aggravatingPatterns: ['hinge'],
  startedInTraining: true,
  route: 'urgent',
  caseId: null,
};
const [first, second] = RED_FLAG_ITEMS;
const clinicianCopy: PainReportDto = {
  ...coachCopy,
  note: 'Worse after deadlifts, and at night',
  redFlags: { [first.id]: false, [second.id]: true, both_legs: false, retired_question: false },
};
const told = [{ name: 'Dr Lee', kind: 'red_flag_urgent' }];

describe('the pain-report page', () => {
  it('shows every answer, yes first, then no, with its question — and an answer to a question no longer asked under its id', () => {
    renderWithProviders(<PainReportDetails detail={{ report: clinicianCopy, told } satisfies PainReportDetailDto} />);
    const answers = screen.getByRole('region', { name: 'Warning-sign answers' });
    expect(within(answers).getByText('Yes to 1 of 4 questions.')).toBeInTheDocument();
    const items = within(answers).getAllByRole('listitem');
    // A retired question (the old "both legs" wording) reads in its own words; an id never asked, as itself.
    expect(items.map((li) => li.textContent)).toEqual([
      `${second.question}▲ Yes`,
      `${first.question}No`,
      `${redFlagQuestion('both_legs')!.question}No`,
      'retired_questionNo',
    ]);
    expect(screen.getByText('Worse after deadlifts, and at night')).toBeInTheDocument();
    expect(screen.getByText(/Dr Lee/).closest('li')).toHaveTextContent('asked as a clinician to review today, with the answers');
    expect(screen.getByText(/contact their clinician today/)).toBeInTheDocument();
  });

  it("a coach's copy (no note, no answers) shows the scores and says the rest is for clinicians", () => {
    renderWithProviders(<PainReportDetails detail={{ report: coachCopy, told: [] }} />);
    expect(screen.queryByRole('region', { name: 'Warning-sign answers' })).toBeNull();
    expect(screen.queryByRole('region', { name: 'In the athlete’s words' })).toBeNull();
    expect(screen.getByText('5/10')).toBeInTheDocument();
    expect(screen.getByText(/for their clinicians only/)).toBeInTheDocument();
  });

  it('orders stored answers yes first, each group by the screen, unknown ids last', () => {
    expect(answerRows({ zzz: true, yyy: false, [second.id]: false, [first.id]: true }).map((a) => a.id)).toEqual([
      first.id,
      'zzz',
      second.id,
      'yyy',
    ]);
  });
});
