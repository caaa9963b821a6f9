import { useRef, useState, type FormEvent } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CaseDocumentFieldsSchema, type CaseDocumentFieldsInput } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { UploadProgressBar } from '../../../components/ui/UploadProgressBar';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { isAbort, type UploadProgress } from '../../../lib/upload';
import { useUploadCaseDocument } from '../api/upload-case-document';
import { DOCUMENT_ACCEPT } from './document-words';

const TEXT_FIELDS = ['title', 'documentDate', 'issuedBy'] as const;

/**
 * Title, date and issuer, then the file. While it uploads the bar shows how far it has got and the
 * upload can be cancelled; on a refusal the server's sentence shows and everything typed (and the
 * chosen file) stays, so one fix and a second press is enough.
 */
export function AttachDocumentForm({
  orgId,
  caseId,
  large,
  onDone,
  onCancel,
}: {
  orgId: string;
  caseId: string;
  /** Large targets on the athlete's phone screens. */
  large?: boolean;
  onDone: () => void;
  onCancel: () => void;
}) {
  const upload = useUploadCaseDocument(orgId, caseId);
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | undefined>();
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const controller = useRef<AbortController | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<CaseDocumentFieldsInput>({
    resolver: zodResolver(CaseDocumentFieldsSchema),
    defaultValues: { title: '', documentDate: '', issuedBy: '' },
  });

  function send(fields: CaseDocumentFieldsInput) {
    if (!file) {
      setFileError('Choose the file to attach.');
      return;
    }
    const abort = new AbortController();
    controller.current = abort;
    setProgress({ loaded: 0, total: file.size, percent: 0 });
    upload.mutate(
      { fields, file, options: { signal: abort.signal, onProgress: setProgress } },
      {
        onSuccess: onDone,
        onError: (error) => {
          applyServerFieldErrors(error, setError, TEXT_FIELDS);
          if (isApiError(error) && error.fields.file) setFileError(error.fields.file.join(' '));
        },
        onSettled: () => {
          setProgress(null);
          controller.current = null;
        },
      },
    );
  }
  // Built at submit time, not during render: the handler reaches the abort controller's ref.
  const onSubmit = (e: FormEvent<HTMLFormElement>) =>
    void handleSubmit(send, () => {
      if (!file) setFileError('Choose the file to attach.');
    })(e);

  const busy = upload.isPending;
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Attach a document" className="space-y-3">
      {isAbort(upload.error) ? (
        <Notice tone="info" role="status" title="Upload cancelled">
          <p>Nothing was saved. The form is as you left it.</p>
        </Notice>
      ) : (
        <ErrorNotice error={upload.error} title="The document was not saved" />
      )}
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          label="Title"
          hint="What it is, e.g. “MRI report, lower back”."
          large={large}
          disabled={busy}
          error={errors.title?.message}
          {...register('title')}
          className="sm:col-span-2"
        />
        <TextField label="Date on the document" type="date" large={large} disabled={busy} error={errors.documentDate?.message} {...register('documentDate')} />
        <TextField
          label="Issued by"
          hint="The physician, clinic or hospital."
          large={large}
          disabled={busy}
          error={errors.issuedBy?.message}
          {...register('issuedBy')}
        />
        <TextField
          label="File"
          type="file"
          // The shared field frame styles text boxes; a file picker also needs room above and below its button.
          style={{ paddingBlock: '0.5rem' }}
          hint="PDF, or a photo or scan as JPEG, PNG or HEIC."
          accept={DOCUMENT_ACCEPT}
          large={large}
          disabled={busy}
          error={fileError}
          className="sm:col-span-2"
          onChange={(e) => {
            setFile(e.currentTarget.files?.[0] ?? null);
            setFileError(undefined);
          }}
        />
      </div>
      {progress && (
        <UploadProgressBar
          label="Uploading the document"
          {...progress}
          onCancel={() => controller.current?.abort()}
        />
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={busy} size={large ? 'lg' : 'md'}>
          Attach document
        </Button>
        <Button variant="secondary" size={large ? 'lg' : 'md'} disabled={busy} onClick={onCancel}>
          Close
        </Button>
      </div>
    </form>
  );
}
