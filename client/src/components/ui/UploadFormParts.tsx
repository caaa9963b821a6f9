import type { FileUpload } from '../../lib/use-file-upload';
import { isAbort } from '../../lib/upload';
import { Button } from './Button';
import { TextField, type TextFieldProps } from './Field';
import { ErrorNotice, Notice } from './Notice';
import { UploadProgressBar } from './UploadProgressBar';

/** Above an upload form: a cancelled upload is not an error (nothing was saved, nothing was lost). */
export function UploadOutcome({ error, failedTitle }: { error: unknown; failedTitle: string }) {
  return isAbort(error) ? (
    <Notice tone="info" role="status" title="Upload cancelled">
      <p>Nothing was saved. The form is as you left it.</p>
    </Notice>
  ) : (
    <ErrorNotice error={error} title={failedTitle} />
  );
}

/** Below an upload form: the progress while it uploads (with its cancel), then send and close. */
export function UploadFormFooter({
  upload: { progress, busy, cancel },
  progressLabel,
  submitLabel,
  large,
  onClose,
}: {
  upload: FileUpload;
  progressLabel: string;
  submitLabel: string;
  large?: boolean;
  onClose?: () => void;
}) {
  return (
    <>
      {progress && <UploadProgressBar label={progressLabel} {...progress} onCancel={cancel} />}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={busy} size={large ? 'lg' : 'md'}>
          {submitLabel}
        </Button>
        {onClose && (
          <Button variant="secondary" size={large ? 'lg' : 'md'} disabled={busy} onClick={onClose}>
            Close
          </Button>
        )}
      </div>
    </>
  );
}

/** The file picker of an upload form. */
export function FileField(props: Omit<TextFieldProps, 'type'>) {
  // The shared field frame styles text boxes; a file picker also needs room above and below its button.
  return <TextField type="file" style={{ paddingBlock: '0.5rem' }} {...props} />;
}
