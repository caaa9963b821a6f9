import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { asSubject } from '../../../../../policies/access';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, Panel } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { useClips } from '../api/get-clips';
import { AddClipForm } from './AddClipForm';
import { ClipList, clipHref } from './ClipList';

/**
 * "Technique clips" on a coach's or clinician's athlete page: every clip of the athlete, each opening
 * the player. A coach on the team may add one for the athlete; clinicians watch and write notes.
 */
export function ClipsSection({ orgId, athleteId, athleteName }: { orgId: string; athleteId: string; athleteName: string }) {
  const ability = useAppAbility();
  const navigate = useNavigate();
  const clips = useClips(orgId, { athleteId });
  const [adding, setAdding] = useState(false);
  const canAdd = ability.can('create', asSubject('Clip', { id: '', organizationId: orgId, athleteId, uploadedByUserId: '' }));

  return (
    <Panel
      title="Technique clips"
      actions={
        canAdd &&
        !adding && (
          <Button variant="secondary" onClick={() => setAdding(true)}>
            Add a clip
          </Button>
        )
      }
    >
      <p className="mb-3 text-sm text-muted">
        Short videos of a set from a logged session. Open one to watch it frame by frame and pin notes.
      </p>
      {adding && (
        <section aria-label="New clip" className="mb-4 rounded-md border border-rule-strong p-3 sm:p-4">
          <h3 className="mb-3 text-base font-bold">New clip of {athleteName}</h3>
          <AddClipForm
            orgId={orgId}
            athleteId={athleteId}
            onDone={(clip) => navigate(clipHref(clip.id))}
            onCancel={() => setAdding(false)}
          />
        </section>
      )}
      {clips.isPending ? (
        <Loading what="clips" />
      ) : clips.isError ? (
        <ErrorNotice error={clips.error} />
      ) : (
        <ClipList clips={clips.data} empty={`No clips of ${athleteName} yet.`} />
      )}
    </Panel>
  );
}

/**
 * A guardian's view of their athlete's clips. The organization decides whether guardians see clips;
 * while it does not, the server answers with no clips and this section is not shown at all.
 */
export function FamilyClips({ orgId, athleteId, name }: { orgId: string; athleteId: string; name: string }) {
  const clips = useClips(orgId, { athleteId });
  if (!clips.isSuccess || clips.data.length === 0) return null;
  return (
    <Panel title={`${name}'s technique clips`}>
      <p className="mb-3 text-sm text-muted">Videos of {name}&apos;s sets, with the coach&apos;s and clinician&apos;s notes.</p>
      <ClipList clips={clips.data} empty="" />
    </Panel>
  );
}
