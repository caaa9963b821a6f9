import { rulesToCondition } from '@casl/ability/extra';
import type { Action, AppAbility, SubjectName } from '../../../policies/access';

export interface SqlFilter {
  /** A boolean SQL expression, or 'FALSE' when no rule grants anything. */
  sql: string;
  params: Record<string, unknown>;
}

type Condition = Record<string, unknown>;

/**
 * The WHERE clause of a list query, built from the same CASL rules that guard single records
 * (CASL's accessibleBy idea for SQL), so a list never holds a row its reader could not open.
 * Supports what our rules use: equality and $in on plain fields, mapped to columns by `columns`.
 */
export function accessibleWhere(
  ability: AppAbility,
  action: Action,
  subject: SubjectName,
  columns: Record<string, string>,
  prefix = 'acl',
  /** `column = ANY(:list)` instead of `column IN (:...list)`: the SQL text then does not depend on the list's length (for prepared statements). */
  opts: { arrays?: boolean } = {},
): SqlFilter {
  const params: Record<string, unknown> = {};
  let n = 0;
  const param = (value: unknown) => {
    const name = `${prefix}${n++}`;
    params[name] = value;
    return `:${name}`;
  };
  const clause = (cond: Condition): string => {
    const parts = Object.entries(cond).map(([field, value]) => {
      const column = columns[field];
      if (!column) throw new Error(`accessibleWhere: no column mapped for ${subject}.${field}`);
      if (value && typeof value === 'object' && !Array.isArray(value)) {
        const ops = Object.entries(value as Record<string, unknown>);
        return ops
          .map(([op, v]) => {
            if (op === '$in' && opts.arrays) return `${column} = ANY(${param(v)})`;
            if (op === '$in') return (v as unknown[]).length ? `${column} IN (:...${param(v).slice(1)})` : 'FALSE';
            if (op === '$eq') return `${column} = ${param(v)}`;
            throw new Error(`accessibleWhere: operator ${op} not supported`);
          })
          .join(' AND ');
      }
      return `${column} = ${param(value)}`;
    });
    return parts.length ? `(${parts.join(' AND ')})` : 'TRUE';
  };
  const sql = rulesToCondition(
    ability.rulesFor(action, subject),
    (rule) => {
      if (rule.inverted) throw new Error('accessibleWhere: inverted rules are not supported');
      return clause((rule.conditions ?? {}) as Condition);
    },
    {
      and: (parts: string[]) => `(${parts.join(' AND ')})`,
      or: (parts: string[]) => `(${parts.join(' OR ')})`,
      empty: () => 'TRUE',
    },
  );
  return { sql: sql ?? 'FALSE', params };
}
