import type { FormEvent } from 'react';
import type { RosterPreviewDto } from '../../../../../policies/dto';
import { ROSTER_MAX_BYTES, ROSTER_MAX_ROWS } from '../../../../../policies/roster';
import { FileField, UploadFormFooter, UploadOutcome } from '../../../components/ui/UploadFormParts';
import { useFileUpload } from '../../../lib/use-file-upload';
import { usePreviewRoster } from '../api/roster-imports';

/**
 * The file and "Check the file". Checking writes no people: the server answers with the preview. A
 * refusal of the whole file (unknown columns, not UTF-8, too large) shows the server's sentence, and
 * the reason about the file itself also shows on the file field.
 */
export function RosterUploadForm({ orgId, onPreview }: { orgId: string; onPreview: (preview: RosterPreviewDto) => void }) {
  const upload = useFileUpload(usePreviewRoster(orgId), {
    missingFile: 'Choose the CSV file to check.',
    onDone: onPreview,
    onFieldErrors: () => undefined,
  });
  const onSubmit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    upload.send({});
  };
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Check a roster file" className="space-y-3">
      <UploadOutcome error={upload.error} failedTitle="The file was not checked" />
      <FileField
        label="Roster file (CSV)"
        hint={`Saved from a spreadsheet as "CSV UTF-8", at most ${ROSTER_MAX_BYTES / (1024 * 1024)} MB and ${ROSTER_MAX_ROWS.toLocaleString('en-US')} rows.`}
        accept=".csv,text/csv"
        {...upload.fileField}
      />
      <UploadFormFooter upload={upload} progressLabel="Uploading the roster" submitLabel="Check the file" />
    </form>
  );
}
