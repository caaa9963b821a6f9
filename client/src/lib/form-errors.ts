import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts the server's per-field messages onto the form's fields. Returns the paths it could not place
 * (fields the form does not show), so the caller can still show the overall message.
 */
export function applyServerFieldErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  formFields: readonly string[],
): string[] {
  if (!isApiError(error)) return [];
  const unplaced: string[] = [];
  for (const [path, messages] of Object.entries(error.fields)) {
    const field = formFields.find((name) => path === name || path.startsWith(`${name}.`));
    if (field) setError(field as Path<T>, { type: 'server', message: messages.join(' ') });
    else unplaced.push(path);
  }
  return unplaced;
}

/**
 * Shared schemas word their messages as the end of a sentence ("is required"), so the field's own
 * label starts it: "E-mail is required". A message that is already a sentence is left alone.
 */
export function fieldSentence(label: string, message: string | undefined): string | undefined {
  if (!message) return undefined;
  const first = message.charAt(0);
  const cleanLabel = label.replace(/\s*\(optional\)$/i, '');
  return first === first.toLowerCase() && first !== first.toUpperCase() ? `${cleanLabel} ${message}` : message;
}
