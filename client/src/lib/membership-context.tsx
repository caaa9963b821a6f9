import { createContext, useContext } from 'react';
import type { MembershipSummaryDto, UserDto } from '../../../policies/dto';

/** The signed-in person and the organization they are working in right now. */
export interface CurrentMembership {
  user: UserDto;
  membership: MembershipSummaryDto;
  orgId: string;
}

export const MembershipContext = createContext<CurrentMembership | null>(null);

export function useCurrentMembership(): CurrentMembership {
  const value = useContext(MembershipContext);
  if (!value) throw new Error('useCurrentMembership needs a signed-in member: wrap the page in the session guard.');
  return value;
}
