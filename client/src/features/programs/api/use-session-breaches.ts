import { useMemo } from 'react';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import type { Breach } from '../../../../../policies/load/compliance';
import type { Unit } from '../../../../../policies/schemas';
import { engineLibrary, liveBreaches } from '../components/live-check';
import { useEngineInputs } from './get-engine-inputs';
import { useLibrary } from './get-library';

/**
 * A saved session's breaches for one athlete, per set, worked out in the browser with the server's
 * engine and inputs — for readers who may not run the server's check (clinicians deciding exceptions).
 */
export function useSessionBreaches(orgId: string, unit: Unit, athleteId: string, session: ProgramSessionDto | undefined) {
  const library = useLibrary(orgId);
  const inputs = useEngineInputs(orgId, [{ id: athleteId, name: '' }]);
  const exercises = useMemo(() => engineLibrary(library.data ?? []), [library.data]);
  const engine = inputs.engines[0];
  const bySet = new Map<string, Breach[]>();
  if (session && engine && library.data) {
    for (const b of liveBreaches({ session, engine, exercises, unit })) bySet.set(b.setId, [...(bySet.get(b.setId) ?? []), b]);
  }
  return { bySet, isPending: inputs.isPending || library.isPending };
}
