import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import { ORG } from '../../test/app';
import { renderWithProviders } from '../../test/render';
import { CaseFhirExport } from './components/CaseFhirExport';

describe('the FHIR export on the case page', () => {
  it('is a download link to the case as FHIR', () => {
    renderWithProviders(<CaseFhirExport orgId={ORG} caseId="22222222-2222-4222-8222-222222222222" />);
    const link = screen.getByRole('link', { name: 'Download for a health record (FHIR)' });
    expect(link).toHaveAttribute('href', `/api/orgs/${ORG}/cases/22222222-2222-4222-8222-222222222222/fhir`);
    expect(link).toHaveAttribute('download');
  });
});
