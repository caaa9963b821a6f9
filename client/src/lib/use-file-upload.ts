import { useRef, useState, type ChangeEvent } from 'react';
import { isApiError } from './api-client';
import type { UploadOptions, UploadProgress } from './upload';

/** What an upload mutation takes: the form's text fields, the chosen file, and progress/abort hooks. */
export interface FileUploadVariables<F> {
  fields: F;
  file: File;
  options?: UploadOptions;
}

/** The part of a react-query upload mutation the forms use. */
export interface FileUploadMutation<F, R> {
  mutate(
    variables: FileUploadVariables<F>,
    callbacks: { onSuccess: (result: R) => void; onError: (error: Error) => void; onSettled: () => void },
  ): void;
  isPending: boolean;
  error: Error | null;
}

/**
 * The file half of an upload form: the chosen file and its error, the progress while it uploads and
 * the way to cancel it. `send` goes to handleSubmit as the valid branch and `requireFile` as the
 * invalid one, so a missing file is named beside the other fields' errors. A refusal keeps the file
 * chosen; the server's message about the file shows on the file field, the others via `onFieldErrors`.
 */
export function useFileUpload<F, R>(
  upload: FileUploadMutation<F, R>,
  { missingFile, onDone, onFieldErrors }: { missingFile: string; onDone: (result: R) => void; onFieldErrors: (error: Error) => void },
) {
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | undefined>();
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const controller = useRef<AbortController | null>(null);

  function send(fields: F) {
    if (!file) {
      setFileError(missingFile);
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
          onFieldErrors(error);
          if (isApiError(error) && error.fields.file) setFileError(error.fields.file.join(' '));
        },
        onSettled: () => {
          setProgress(null);
          controller.current = null;
        },
      },
    );
  }

  return {
    progress,
    busy: upload.isPending,
    error: upload.error,
    send,
    requireFile: () => {
      if (!file) setFileError(missingFile);
    },
    /** Spread onto the file field: locked while uploading, its error, and choosing a file clears it. */
    fileField: {
      disabled: upload.isPending,
      error: fileError,
      onChange: (e: ChangeEvent<HTMLInputElement>) => {
        setFile(e.currentTarget.files?.[0] ?? null);
        setFileError(undefined);
      },
    },
    cancel: () => controller.current?.abort(),
  };
}

export type FileUpload = Pick<ReturnType<typeof useFileUpload>, 'progress' | 'busy' | 'cancel'>;
