import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { useClips } from '../../../features/clips/api/get-clips';
import { AddClipForm } from '../../../features/clips/components/AddClipForm';
import { ClipList, clipHref } from '../../../features/clips/components/ClipList';
import { ButtonLink } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, PageHeader, Panel } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { RoleGate } from '../../layout/RoleGate';
import { ATHLETE_HOME, ATHLETE_NEW_CLIP, ATHLETE_WEEK } from './paths';

export function MyClipsPage() {
  useDocumentTitle('My clips');
  return (
    <RoleGate role="athlete">
      <MyClips />
    </RoleGate>
  );
}

function MyClips() {
  const { orgId, membership } = useCurrentMembership();
  const clips = useClips(orgId, { athleteId: membership.id });
  return (
    <div className="mx-auto max-w-xl space-y-5">
      <p className="text-sm">
        <Link to={ATHLETE_HOME}>← My page</Link>
      </p>
      <PageHeader title="My clips">
        Videos of your sets. Your coach and clinician watch them and pin notes to the moments that matter; open a clip to read them.
      </PageHeader>
      <ButtonLink to={ATHLETE_NEW_CLIP} variant="primary" size="lg">
        Add a clip
      </ButtonLink>
      <Panel title="Clips">
        {clips.isPending ? (
          <Loading what="your clips" />
        ) : clips.isError ? (
          <ErrorNotice error={clips.error} />
        ) : (
          <ClipList clips={clips.data} empty="No clips yet. Film a set on your phone, then add it to the session you logged." />
        )}
      </Panel>
    </div>
  );
}

export function NewClipPage() {
  useDocumentTitle('Add a clip');
  return (
    <RoleGate role="athlete">
      <NewClip />
    </RoleGate>
  );
}

function NewClip() {
  const { orgId, membership } = useCurrentMembership();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  return (
    <div className="mx-auto max-w-xl space-y-5">
      <p className="text-sm">
        <Link to={ATHLETE_WEEK}>← My week</Link>
      </p>
      <PageHeader title="Add a clip">
        A short video of one set, for your coach and clinician. Pick the session you logged and the exercise in it.
      </PageHeader>
      <Panel>
        <AddClipForm
          orgId={orgId}
          athleteId={membership.id}
          logId={params.get('log') ?? undefined}
          large
          onDone={(clip) => navigate(clipHref(clip.id))}
        />
      </Panel>
    </div>
  );
}
