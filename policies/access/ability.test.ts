import { describe, expect, it } from 'vitest';
import { ROLES } from '../roles';
import { asSubject, defineAbilityFor } from './ability';
import { actorFor, recordFor } from './ability-fixtures';
import { ACCESS_MATRIX, RELATIONS } from './matrix';
import { SUBJECT_NAMES } from './subjects';

describe('the access matrix', () => {
  it('covers every role, every subject and every relation', () => {
    expect(new Set(ACCESS_MATRIX.map((r) => r.role))).toEqual(new Set(ROLES));
    expect(new Set(ACCESS_MATRIX.map((r) => r.subject))).toEqual(new Set(SUBJECT_NAMES));
    expect(new Set(ACCESS_MATRIX.map((r) => r.relation))).toEqual(new Set(RELATIONS));
    // Whatever a role may do somewhere, the table also says it may not do it in another organization.
    for (const row of ACCESS_MATRIX.filter((r) => r.allowed)) {
      const otherOrg = ACCESS_MATRIX.find(
        (r) => r.role === row.role && r.subject === row.subject && r.action === row.action && r.relation === 'other-org',
      );
      expect(otherOrg, `${row.role} ${row.action} ${row.subject} in another organization`).toBeDefined();
    }
  });

  it('has no duplicate rows', () => {
    const keys = ACCESS_MATRIX.map((r) => `${r.role} ${r.action} ${r.subject} ${r.relation}`);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it('never allows anything in another organization', () => {
    expect(ACCESS_MATRIX.filter((r) => r.relation === 'other-org' && r.allowed)).toEqual([]);
  });
});

describe('defineAbilityFor, row by row of the matrix', () => {
  it.each(ACCESS_MATRIX.map((r) => [`${r.role} ${r.allowed ? 'may' : 'may not'} ${r.action} ${r.subject} (${r.relation})`, r] as const))(
    '%s',
    (_name, row) => {
      const actor = actorFor(row.role);
      const ability = defineAbilityFor(actor);
      const record = recordFor(row.subject, row.relation, actor);
      expect(ability.can(row.action, asSubject(row.subject, record) as never)).toBe(row.allowed);
    },
  );
});
