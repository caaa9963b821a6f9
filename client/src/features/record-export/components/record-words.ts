import type { RecordExportDto } from '../../../../../policies/dto';
import { formatDateTime } from '../../../lib/format';

/** Sizes as people read them: "2.4 MB" (decimal units, as file managers on phones show them). */
export function sizeWords(bytes: number | null): string {
  if (bytes === null) return '';
  if (bytes < 1000) return `${bytes} bytes`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(0)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}

/** A request's state in one sentence, word first (never colour alone). */
export function stateWords(r: RecordExportDto): { word: string; sentence: string } {
  switch (r.state) {
    case 'preparing':
      return { word: 'Preparing', sentence: `Asked for ${formatDateTime(r.requestedAt)}. We will e-mail you a link when it is ready.` };
    case 'ready':
      return {
        word: r.downloadedAt ? 'Downloaded' : 'Ready',
        sentence: `${r.downloadedAt ? `Downloaded ${formatDateTime(r.downloadedAt)}. ` : 'The link is in your e-mail. '}It works until ${formatDateTime(r.expiresAt)} (${sizeWords(r.sizeBytes)}).`,
      };
    case 'expired':
      return { word: 'Expired', sentence: `The link stopped working ${formatDateTime(r.expiresAt)}. Ask for a new copy if you need one.` };
    case 'failed':
      return { word: 'Not made', sentence: r.problem ?? 'The copy could not be prepared. Ask again.' };
  }
}
