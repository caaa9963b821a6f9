import { describe, expect, it, vi } from 'vitest';
import { ApiError } from './api-client';
import { applyServerFieldErrors, fieldSentence } from './form-errors';

describe('fieldSentence', () => {
  it('starts a schema fragment with the field label', () => {
    expect(fieldSentence('E-mail', 'is required')).toBe('E-mail is required');
  });
  it('drops "(optional)" from the label', () => {
    expect(fieldSentence('Sport (optional)', 'must be at most 80 characters')).toBe('Sport must be at most 80 characters');
  });
  it('leaves a whole sentence alone', () => {
    expect(fieldSentence('Person', 'Choose a person first.')).toBe('Choose a person first.');
  });
  it('gives nothing for no message', () => {
    expect(fieldSentence('E-mail', undefined)).toBeUndefined();
  });
});

describe('applyServerFieldErrors', () => {
  it('places messages on the matching fields, including nested paths, and reports the rest', () => {
    const setError = vi.fn();
    const error = new ApiError({
      status: 400,
      code: 'validation_failed',
      message: 'Check the form.',
      fields: { email: ['is already invited'], 'roles.1': ['must not repeat a role'], unknownThing: ['x'] },
    });
    const unplaced = applyServerFieldErrors(error, setError, ['email', 'roles']);
    expect(setError).toHaveBeenCalledWith('email', { type: 'server', message: 'is already invited' });
    expect(setError).toHaveBeenCalledWith('roles', { type: 'server', message: 'must not repeat a role' });
    expect(unplaced).toEqual(['unknownThing']);
  });

  it('ignores errors that are not from the API', () => {
    const setError = vi.fn();
    expect(applyServerFieldErrors(new Error('boom'), setError, ['email'])).toEqual([]);
    expect(setError).not.toHaveBeenCalled();
  });
});
