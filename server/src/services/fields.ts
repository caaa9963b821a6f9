import { subject as tagSubject } from '@casl/ability';
import { permittedFieldsOf } from '@casl/ability/extra';
import type { AppAbility, SubjectName } from '../../../policies/access';

/**
 * Keeps only the fields the reader's CASL field rules allow on this record. Rules without a field
 * list allow every field.
 */
export function pickPermitted<T extends Record<string, unknown>>(ability: AppAbility, type: SubjectName, record: T): Partial<T> {
  const all = Object.keys(record);
  const fields = permittedFieldsOf(ability, 'read', tagSubject(type, { ...record }) as never, { fieldsFrom: (rule) => rule.fields ?? all });
  const out: Partial<T> = {};
  for (const f of fields) if (f in record) (out as Record<string, unknown>)[f] = record[f];
  return out;
}
