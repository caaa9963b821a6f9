import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { ApiError } from '../../lib/api-client';
import { ErrorNotice, describeError } from './Notice';

describe('describeError', () => {
  it('words a refusal as "You can\'t do that" with the reason', () => {
    const error = new ApiError({ status: 403, code: 'forbidden', message: 'Only admins may remove people.' });
    expect(describeError(error)).toBe("You can't do that: Only admins may remove people.");
  });

  it("uses the caller's wording for a stale edit", () => {
    const error = new ApiError({ status: 409, code: 'version_conflict', message: 'Version mismatch.' });
    expect(describeError(error, { versionConflict: 'Someone else changed this person; reload to see the latest.' })).toBe(
      'Someone else changed this person; reload to see the latest.',
    );
  });

  it('never shows a raw exception', () => {
    expect(describeError(new TypeError('x is undefined'))).toBe('Something unexpected happened. Please try again.');
  });
});

describe('ErrorNotice', () => {
  it('announces the message as an alert, with the reference for support', () => {
    const error = new ApiError({ status: 403, code: 'forbidden', message: 'Not on this care team.', requestId: 'abc-1' });
    render(<ErrorNotice error={error} />);
    const alert = screen.getByRole('alert');
    expect(alert).toHaveTextContent("You can't do that: Not on this care team.");
    expect(alert).toHaveTextContent('Reference for support: abc-1');
  });

  it('renders nothing without an error', () => {
    const { container } = render(<ErrorNotice error={null} />);
    expect(container).toBeEmptyDOMElement();
  });
});
