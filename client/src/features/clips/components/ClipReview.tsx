import { useRef } from 'react';
import type { ClipDto } from '../../../../../policies/dto';
import { formatDate } from '../../../lib/format';
import { clipVideoHref } from '../api/get-clip';
import { ClipNotes } from './ClipNotes';
import { ClipPlayer } from './ClipPlayer';
import { useVideoClock } from './use-video-clock';

/** The player with its notes: beside it on a wide screen, under it on a phone. */
export function ClipReview({ orgId, clip }: { orgId: string; clip: ClipDto }) {
  const videoRef = useRef<HTMLVideoElement>(null);
  const clock = useVideoClock(videoRef);
  return (
    <div className="grid items-start gap-5 lg:grid-cols-[minmax(0,1fr)_22rem]">
      <ClipPlayer
        videoRef={videoRef}
        src={clipVideoHref(orgId, clip)}
        clock={clock}
        notes={clip.notes ?? []}
        label={`${clip.exercise}, ${formatDate(clip.sessionDate)}`}
      />
      <ClipNotes
        orgId={orgId}
        clip={clip}
        timeSeconds={clock.time}
        onChoose={(note) => clock.seek(note.atMs / 1000)}
        onWriting={clock.pause}
      />
    </div>
  );
}
