import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { asSubject } from '../../../../policies/access';
import type { ClipDto } from '../../../../policies/dto';
import { useDeleteClip } from '../../features/clips/api/clip-changes';
import { useClip } from '../../features/clips/api/get-clip';
import { ClipReview } from '../../features/clips/components/ClipReview';
import { Button } from '../../components/ui/Button';
import { ErrorNotice } from '../../components/ui/Notice';
import { Loading, PageHeader } from '../../components/ui/Panel';
import { useAppAbility } from '../../lib/ability';
import { formatDate, formatDateTime } from '../../lib/format';
import { useCurrentMembership, type CurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';
import { ATHLETE_CLIPS } from './athlete/paths';
import { clinicianAthleteHref } from './clinician/paths';
import { coachAthleteHref } from './coach';

/** One clip, for everyone who may watch it: the athlete, the care team, and guardians when allowed. */
export function ClipPage() {
  const { clipId = '' } = useParams();
  const { orgId } = useCurrentMembership();
  const clip = useClip(orgId, clipId);
  useDocumentTitle(clip.data ? `Clip: ${clip.data.exercise}` : 'Clip');

  if (clip.isPending) return <Loading what="the clip" />;
  if (clip.isError) {
    return <ErrorNotice error={clip.error} wording={{ notFound: 'This clip does not exist, was removed, or is not one you may watch.' }} />;
  }
  return <ClipScreen clip={clip.data} />;
}

/** Back to where this person keeps the athlete: the clinic, the coaching page, their own clips, or the family page. */
function backLink(current: CurrentMembership, clip: ClipDto): { to: string; label: string } {
  const { actor } = current.membership;
  if (actor.clinicianOf.includes(clip.athleteId)) return { to: clinicianAthleteHref(clip.athleteId), label: clip.athleteName };
  if (actor.coachOf.includes(clip.athleteId)) return { to: coachAthleteHref(clip.athleteId), label: clip.athleteName };
  if (current.membership.id === clip.athleteId) return { to: ATHLETE_CLIPS, label: 'My clips' };
  return { to: '/guardian', label: clip.athleteName };
}

function ClipScreen({ clip }: { clip: ClipDto }) {
  const current = useCurrentMembership();
  const { orgId } = current;
  const ability = useAppAbility();
  const navigate = useNavigate();
  const remove = useDeleteClip(orgId);
  const [confirming, setConfirming] = useState(false);
  const back = backLink(current, clip);
  const canDelete = ability.can(
    'delete',
    asSubject('Clip', { id: clip.id, organizationId: orgId, athleteId: clip.athleteId, uploadedByUserId: clip.uploadedByUserId }),
  );

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link to={back.to}>← {back.label}</Link>
      </p>
      <PageHeader title={`${clip.exercise}, ${formatDate(clip.sessionDate)}`}>
        <span className="block">
          <span className="font-semibold text-ink">{clip.athleteName}</span> · session of {formatDate(clip.sessionDate)} · added by{' '}
          {clip.uploadedByName}, {formatDateTime(clip.uploadedAt)}
        </span>
        {clip.caption && <span className="mt-1 block break-words">“{clip.caption}”</span>}
      </PageHeader>

      <ClipReview orgId={orgId} clip={clip} />

      {canDelete && (
        <div className="border-t border-rule pt-4">
          {!confirming ? (
            <Button variant="danger" onClick={() => setConfirming(true)}>
              Remove this clip
            </Button>
          ) : (
            <div role="group" aria-label="Confirm removal" className="space-y-2 text-sm">
              <ErrorNotice error={remove.error} />
              <p>Remove this clip and its notes? The video is deleted; the audit trail keeps that it was here.</p>
              <div className="flex flex-wrap gap-2">
                <Button
                  variant="danger"
                  busy={remove.isPending}
                  onClick={() => remove.mutate(clip.id, { onSuccess: () => navigate(back.to) })}
                >
                  Yes, remove the clip
                </Button>
                <Button variant="secondary" onClick={() => setConfirming(false)} autoFocus>
                  Keep it
                </Button>
              </div>
            </div>
          )}
        </div>
      )}
    </div>
  );
}
