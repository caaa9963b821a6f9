import { describe, expect, it } from 'vitest';
import { defaultRole, orderedRoles } from './role-views';

describe('defaultRole', () => {
  it('opens the clinical view first for a clinician who is also an admin', () => {
    expect(defaultRole(['admin', 'clinician'])).toBe('clinician');
  });
  it('opens the only role a person holds', () => {
    expect(defaultRole(['guardian'])).toBe('guardian');
  });
  it('returns to the view chosen last, if the person still holds that role', () => {
    expect(defaultRole(['admin', 'coach'], 'admin')).toBe('admin');
    expect(defaultRole(['admin', 'coach'], 'clinician')).toBe('coach');
  });
  it('has nothing to open without roles', () => {
    expect(defaultRole([])).toBeNull();
  });
});

describe('orderedRoles', () => {
  it('orders the switcher the same way every time', () => {
    expect(orderedRoles(['guardian', 'admin', 'athlete', 'coach'])).toEqual(['coach', 'admin', 'athlete', 'guardian']);
  });
});
