import { useCreateSession } from '../api/sessions';
import { DatedSessionForm, type AddSessionProps } from './DatedSessionForm';

/** A dated, titled draft of one athlete's (or a group's) program; its exercises are added in the session editor. */
export function AddSessionForm({ orgId, programId, ...rest }: AddSessionProps) {
  const create = useCreateSession(orgId, programId);
  return <DatedSessionForm add={create} label="New session" placeholder="e.g. Lower A" submitLabel="Add session" {...rest} />;
}
