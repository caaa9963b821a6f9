import { DatedSessionForm, type AddSessionProps } from '../../programs/components/DatedSessionForm';
import { useAddTeamSession } from '../api/team-programs';

/** A dated, titled team session; its exercises and sets are written in the editor that opens next. */
export function AddTeamSessionForm({ orgId, programId, ...rest }: AddSessionProps) {
  const add = useAddTeamSession(orgId, programId);
  return (
    <DatedSessionForm
      add={add}
      label="Add a team session"
      heading="Add a team session"
      placeholder="e.g. Squad strength"
      submitLabel="Add team session"
      {...rest}
    />
  );
}
