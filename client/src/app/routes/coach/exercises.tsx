import { Link } from 'react-router-dom';
import { ExerciseLibrary } from '../../../features/exercises/components/ExerciseLibrary';
import { PageHeader } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { RoleGate } from '../../layout/RoleGate';

/** The organization's exercise library: what programs are written from, and how each is checked. */
export function CoachExercisesPage() {
  useDocumentTitle('Exercise library');
  return (
    <RoleGate role="coach">
      <Library />
    </RoleGate>
  );
}

function Library() {
  const { orgId } = useCurrentMembership();
  const ability = useAppAbility();
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link to="/coach">← My athletes</Link>
      </p>
      <PageHeader title="Exercise library">
        Patterns decide which limits apply to an exercise; the available weight increments decide what a fix rounds down to.
      </PageHeader>
      <ExerciseLibrary orgId={orgId} canEdit={ability.can('update', 'Exercise')} />
    </div>
  );
}
