import { useCallback, useState } from 'react';
import type { MembershipSummaryDto } from '../../../policies/dto';

const KEY = 'loadline.org';

function stored(): string | null {
  try {
    return localStorage.getItem(KEY);
  } catch {
    return null;
  }
}

/**
 * Which organization the person is working in, for people who belong to more than one. Only the
 * organization's id is kept in the browser; it grants nothing by itself.
 */
export function useActiveOrg(memberships: MembershipSummaryDto[]) {
  const [chosen, setChosen] = useState<string | null>(stored);
  const membership = memberships.find((m) => m.organizationId === chosen) ?? memberships[0] ?? null;

  const choose = useCallback((orgId: string) => {
    setChosen(orgId);
    try {
      localStorage.setItem(KEY, orgId);
    } catch {
      // Without storage the choice lasts until the page reloads, which is fine.
    }
  }, []);

  return { membership, choose };
}
