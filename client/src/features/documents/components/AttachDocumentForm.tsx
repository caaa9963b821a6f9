import type { FormEvent } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CaseDocumentFieldsSchema, type CaseDocumentFieldsInput } from '../../../../../policies/schemas';
import { TextField } from '../../../components/ui/Field';
import { FileField, UploadFormFooter, UploadOutcome } from '../../../components/ui/UploadFormParts';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { useFileUpload } from '../../../lib/use-file-upload';
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
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<CaseDocumentFieldsInput>({
    resolver: zodResolver(CaseDocumentFieldsSchema),
    defaultValues: { title: '', documentDate: '', issuedBy: '' },
  });
  const upload = useFileUpload(useUploadCaseDocument(orgId, caseId), {
    missingFile: 'Choose the file to attach.',
    onDone,
    onFieldErrors: (error) => applyServerFieldErrors(error, setError, TEXT_FIELDS),
  });

  // Built at submit time, not during render: the handler reaches the abort controller's ref.
  const onSubmit = (e: FormEvent<HTMLFormElement>) => void handleSubmit(upload.send, upload.requireFile)(e);

  const busy = upload.busy;
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Attach a document" className="space-y-3">
      <UploadOutcome error={upload.error} failedTitle="The document was not saved" />
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
        <TextField
          label="Date on the document"
          type="date"
          large={large}
          disabled={busy}
          error={errors.documentDate?.message}
          {...register('documentDate')}
        />
        <TextField
          label="Issued by"
          hint="The physician, clinic or hospital."
          large={large}
          disabled={busy}
          error={errors.issuedBy?.message}
          {...register('issuedBy')}
        />
        <FileField
          label="File"
          hint="PDF, or a photo or scan as JPEG, PNG or HEIC."
          accept={DOCUMENT_ACCEPT}
          large={large}
          className="sm:col-span-2"
          {...upload.fileField}
        />
      </div>
      <UploadFormFooter
        upload={upload}
        progressLabel="Uploading the document"
        submitLabel="Attach document"
        large={large}
        onClose={onCancel}
      />
    </form>
  );
}
