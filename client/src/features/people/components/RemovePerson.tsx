import { useState } from 'react';
import type { PersonDto } from '../../../../../policies/dto';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useRemovePerson } from '../api/remove-person';

/** Removing someone ends their access here; it asks once more, in words, before doing it. */
export function RemovePerson({
  orgId,
  organizationName,
  person,
  onRemoved,
}: {
  orgId: string;
  organizationName: string;
  person: PersonDto;
  onRemoved: () => void;
}) {
  const remove = useRemovePerson(orgId, person.id);
  const [confirming, setConfirming] = useState(false);

  if (!confirming) {
    return (
      <Button variant="danger" onClick={() => setConfirming(true)}>
        Remove from organization
      </Button>
    );
  }
  return (
    <div className="space-y-3" role="group" aria-label="Confirm removal">
      <ErrorNotice error={remove.error} />
      <p className="text-sm">
        Remove <strong>{person.displayName}</strong> from {organizationName}? They lose access to everything here at once, and leave every
        care team they are on. The audit trail keeps what they did.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button variant="danger" busy={remove.isPending} onClick={() => remove.mutate(undefined, { onSuccess: onRemoved })}>
          Yes, remove {person.displayName}
        </Button>
        <Button variant="secondary" onClick={() => setConfirming(false)} autoFocus>
          Keep {person.displayName}
        </Button>
      </div>
    </div>
  );
}
