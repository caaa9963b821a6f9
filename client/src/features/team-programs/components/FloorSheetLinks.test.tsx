import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { FloorSheetLinks } from './FloorSheetLinks';

const ORG = '11111111-1111-4111-8111-111111111111';
const SESSION = '22222222-2222-4222-8222-222222222222';

describe('FloorSheetLinks', () => {
  it('offers the PDF and the CSV of the team session as downloads', () => {
    render(<FloorSheetLinks orgId={ORG} teamSessionId={SESSION} />);
    const pdf = screen.getByRole('link', { name: 'Floor sheet (PDF)' });
    expect(pdf).toHaveAttribute('href', `/api/orgs/${ORG}/team-sessions/${SESSION}/floor-sheet.pdf`);
    expect(pdf).toHaveAttribute('download');
    // The short visible "CSV" is named in full for screen readers (WCAG 2.2 SC 2.4.4, link purpose).
    const csv = screen.getByRole('link', { name: 'Floor sheet as CSV' });
    expect(csv).toHaveTextContent('CSV');
    expect(csv).toHaveAttribute('href', `/api/orgs/${ORG}/team-sessions/${SESSION}/floor-sheet.csv`);
    expect(csv).toHaveAttribute('download');
  });
});
