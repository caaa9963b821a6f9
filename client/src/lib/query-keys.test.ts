import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { queryKeys } from './query-keys';
import { programKeys } from '../features/programs/api/keys';
import { teamKeys } from '../features/team-programs/api/team-programs';
import { injuryReportKeys } from '../features/injury-report/api/injury-report';
import { exceptionKeys } from '../features/exceptions/api/exceptions';
import { groupKeys } from '../features/groups/api/groups';
import { exercisesKey } from '../features/exercises/api/exercises';
import { stageCriteriaKey } from '../features/stage-criteria/api/stage-criteria';

/**
 * A person in several organizations switches between them (app/active-org.ts). The cache never mixes
 * them because every query about an organization's records is keyed ['orgs', orgId, …]: switching
 * reads other keys, and nothing of organization A can be shown while B is in view.
 */

/** Keys about no organization: the session, one's own account, public pages. */
const ORG_FREE = new Set(['letterCheck']);
const ORG_FREE_IDENTIFIERS = [
  'sessionQueryKey',
  'twoStepQueryKey',
  'signupStatusKey',
  '[PREVIEW_KEY, token]',
  'queryKeys.letterCheck(code)',
  // The offline copy puts back keys it saved from the queries themselves (already organization-keyed).
  'entry.key',
];

type Factory = (...args: unknown[]) => readonly unknown[];

describe('query keys', () => {
  it('every key factory puts the organization first', () => {
    const families: Record<string, Record<string, Factory>> = {
      queryKeys: queryKeys as unknown as Record<string, Factory>,
      programKeys: programKeys as unknown as Record<string, Factory>,
      teamKeys: teamKeys as unknown as Record<string, Factory>,
      injuryReportKeys: injuryReportKeys as unknown as Record<string, Factory>,
      exceptionKeys: exceptionKeys as unknown as Record<string, Factory>,
      groupKeys: groupKeys as unknown as Record<string, Factory>,
      single: { exercisesKey, stageCriteriaKey } as unknown as Record<string, Factory>,
    };
    let checked = 0;
    for (const [family, factories] of Object.entries(families)) {
      for (const [name, make] of Object.entries(factories)) {
        if (ORG_FREE.has(name)) continue;
        const key = make('org-a', 'x', 'y', 1);
        expect(key.slice(0, 2), `${family}.${name}`).toEqual(['orgs', 'org-a']);
        checked += 1;
      }
    }
    expect(checked).toBeGreaterThan(50);
  });

  it('every query in the client names its organization, unless it is about none', () => {
    const root = join(import.meta.dirname, '..');
    const files = (dir: string): string[] =>
      readdirSync(dir).flatMap((name) => {
        const path = join(dir, name);
        if (statSync(path).isDirectory()) return files(path);
        return /\.tsx?$/.test(name) && !/\.test\.tsx?$/.test(name) ? [path] : [];
      });
    const loose: string[] = [];
    for (const file of files(root)) {
      for (const m of readFileSync(file, 'utf8').matchAll(/queryKey: (\[[^\]]*\]|[^,}\n]+)/g)) {
        const expr = m[1].replace(/ as const$/, '').trim();
        // `key` is a local made from queryKeys with the orgId a line above (notice preferences).
        if (expr.includes('orgId') || expr === 'key' || ORG_FREE_IDENTIFIERS.includes(expr)) continue;
        loose.push(`${file.slice(root.length + 1)}: ${expr}`);
      }
    }
    expect(loose).toEqual([]);
  });
});
