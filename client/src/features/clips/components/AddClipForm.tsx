import type { FormEvent } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import type { ClipDto, TrainingLogDto } from '../../../../../policies/dto';
import { ClipFieldsSchema } from '../../../../../policies/schemas';
import { SelectField, TextAreaField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { FileField, UploadFormFooter, UploadOutcome } from '../../../components/ui/UploadFormParts';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format';
import { useFileUpload } from '../../../lib/use-file-upload';
import { CLIP_SESSION_DAYS, sessionExercises, useLoggedSessions } from '../api/get-logged-sessions';
import { useUploadClip } from '../api/upload-clip';

type Input = z.input<typeof ClipFieldsSchema>;
type Output = z.output<typeof ClipFieldsSchema>;

const CLIP_ACCEPT = 'video/mp4,video/webm,video/quicktime,.mp4,.webm,.mov';

/**
 * A short video of one set: which logged session, which exercise in it, an optional caption, the
 * file. Only sessions with sets can be chosen, since a clip belongs to one of the session's exercises.
 */
export function AddClipForm({
  orgId,
  athleteId,
  logId,
  large,
  onDone,
  onCancel,
}: {
  orgId: string;
  athleteId: string;
  /** The session chosen before the form opened (its row's "Add a clip"). */
  logId?: string;
  large?: boolean;
  onDone: (clip: ClipDto) => void;
  onCancel?: () => void;
}) {
  const sessions = useLoggedSessions(orgId, athleteId);
  const withSets = (sessions.data ?? []).filter((log) => log.sets.length > 0);

  if (sessions.isPending) return <Loading what="logged sessions" />;
  if (sessions.isError) return <ErrorNotice error={sessions.error} />;
  if (withSets.length === 0) {
    return (
      <Notice tone="info" title="No logged session to add a clip to">
        <p>
          A clip belongs to one exercise of a logged session. Log the session with its sets first (the last {CLIP_SESSION_DAYS} days can be
          chosen).
        </p>
      </Notice>
    );
  }
  const first = withSets.find((l) => l.id === logId) ?? withSets[0];
  return (
    <ClipFields
      orgId={orgId}
      athleteId={athleteId}
      sessions={withSets}
      initial={{ trainingLogId: first.id, exercise: sessionExercises(first)[0] ?? '' }}
      large={large}
      onDone={onDone}
      onCancel={onCancel}
    />
  );
}

function ClipFields({
  orgId,
  athleteId,
  sessions,
  initial,
  large,
  onDone,
  onCancel,
}: {
  orgId: string;
  athleteId: string;
  sessions: TrainingLogDto[];
  initial: { trainingLogId: string; exercise: string };
  large?: boolean;
  onDone: (clip: ClipDto) => void;
  onCancel?: () => void;
}) {
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    control,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(ClipFieldsSchema),
    defaultValues: { athleteId, trainingLogId: initial.trainingLogId, exercise: initial.exercise, caption: '' },
  });
  const upload = useFileUpload(useUploadClip(orgId), {
    missingFile: 'Choose the video to upload.',
    onDone,
    onFieldErrors: (error) => applyServerFieldErrors(error, setError, ['trainingLogId', 'exercise', 'caption']),
  });
  const chosenId = useWatch({ control, name: 'trainingLogId' });
  const chosenLog = sessions.find((l) => l.id === chosenId) ?? sessions[0];
  const exercises = sessionExercises(chosenLog);
  const busy = upload.busy;

  // Built at submit time, not during render: the handler reaches the abort controller's ref.
  const onSubmit = (e: FormEvent<HTMLFormElement>) => void handleSubmit(upload.send, upload.requireFile)(e);

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Add a clip" className="space-y-3">
      <UploadOutcome error={upload.error} failedTitle="The clip was not saved" />
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Session"
          large={large}
          disabled={busy}
          error={errors.trainingLogId?.message}
          {...register('trainingLogId', {
            onChange: (e: { target: { value: string } }) => {
              const log = sessions.find((l) => l.id === e.target.value);
              setValue('exercise', log ? (sessionExercises(log)[0] ?? '') : '');
            },
          })}
        >
          {sessions.map((log) => (
            <option key={log.id} value={log.id}>
              {formatDate(log.date)} — {sessionExercises(log).join(', ')}
            </option>
          ))}
        </SelectField>
        <SelectField label="Exercise" large={large} disabled={busy} error={errors.exercise?.message} {...register('exercise')}>
          {exercises.map((name) => (
            <option key={name} value={name}>
              {name}
            </option>
          ))}
        </SelectField>
        <TextAreaField
          label="Caption (optional)"
          hint="E.g. “Last set, felt the left hip shift”."
          rows={2}
          large={large}
          disabled={busy}
          error={errors.caption?.message}
          className="sm:col-span-2"
          {...register('caption')}
        />
        <FileField
          label="Video"
          hint="A short MP4, WebM or MOV video of the set, straight from the phone."
          accept={CLIP_ACCEPT}
          large={large}
          className="sm:col-span-2"
          {...upload.fileField}
        />
      </div>
      <UploadFormFooter upload={upload} progressLabel="Uploading the clip" submitLabel="Upload clip" large={large} onClose={onCancel} />
    </form>
  );
}
