import { useAbility } from '@casl/react';
import type { AppAbility } from '../../../policies/access';

/** The same CASL ability the server builds, made from the session's actor; used to hide what can't be done. */
export function useAppAbility(): AppAbility {
  return useAbility<AppAbility>();
}
