const TYPE_WORDS: Record<string, string> = {
  'application/pdf': 'PDF',
  'image/jpeg': 'JPEG image',
  'image/png': 'PNG image',
  'image/heic': 'HEIC image',
  'image/heif': 'HEIF image',
};

/** What kind of file it is, in words, from the type the server found in the file's own bytes. */
export function documentTypeWords(mediaType: string): string {
  return TYPE_WORDS[mediaType] ?? mediaType;
}

export function fileSizeWords(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

/** What the file picker offers; the server checks the bytes anyway, whatever the name says. */
export const DOCUMENT_ACCEPT = 'application/pdf,image/jpeg,image/png,image/heic,image/heif,.pdf,.jpg,.jpeg,.png,.heic,.heif';
