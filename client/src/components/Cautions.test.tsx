import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import { RED_FLAG_ITEMS } from '../../../policies/red-flags';
import { RedFlagCaution } from './Cautions';

// Sources: NICE NG59 (2016, updated 2020); Finucane et al. 2020, JOSPT 50(7):350–372 — the same tiers the report routes by.

describe('the warning-signs box', () => {
  it('shows the two tiers of the report, each listing exactly its items from policies/red-flags.ts (NICE NG59; Finucane et al. 2020)', () => {
    render(<RedFlagCaution emergencyNumber="112" />);
    const box = screen.getByRole('region', { name: 'Warning signs' });
    const now = within(box).getByRole('region', { name: 'Stop training and get urgent medical care now' });
    const today = within(box).getByRole('region', { name: 'Contact your clinician today' });
    const lines = (el: HTMLElement) =>
      within(el)
        .getAllByRole('listitem')
        .map((li) => li.textContent);
    expect(lines(now)).toEqual(RED_FLAG_ITEMS.filter((i) => i.tier === 'emergency').map((i) => i.sign));
    expect(lines(today)).toEqual(RED_FLAG_ITEMS.filter((i) => i.tier === 'urgent').map((i) => i.sign));
    expect(within(now).getByText(/In an emergency call/)).toHaveTextContent('112');
  });

  it('names the added NG59 / Finucane items and new symptoms in both legs, in plain words (NICE NG59; Finucane et al. 2020)', () => {
    render(<RedFlagCaution />);
    const box = screen.getByRole('region', { name: 'Warning signs' });
    expect(box).toHaveTextContent('new pain, numbness, tingling or weakness in both legs');
    expect(box).toHaveTextContent('injected drugs');
    expect(box).toHaveTextContent('bones are weak or thin');
    expect(box).toHaveTextContent('long-term condition that causes inflammation');
    expect(box).not.toHaveTextContent(/In an emergency call/);
  });
});
