import { createHash } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { ZipArchive } from 'archiver';
import type { RecordContents } from '../queries/record-export';
import type { ObjectStorage } from '../storage';

/** The JSON files of the archive, in the order the read-me lists them, with what each holds. */
const DATA_FILES: [keyof RecordContents['data'], string, string][] = [
  ['profile', 'data/profile.json', 'name, date of birth, sport and position, care team and guardians'],
  ['cases', 'data/cases.json', 'injury cases with their participation status history and the plan of limits in force'],
  ['painReports', 'data/pain-reports.json', 'pain reports'],
  ['checkIns', 'data/check-ins.json', 'daily check-ins'],
  ['trainingLogs', 'data/training-logs.json', 'logged training sessions'],
  ['programs', 'data/programs.json', 'training programs and their sessions'],
  ['letters', 'data/letters.json', 'clearance letters (the signed ones are in letters/ as PDF)'],
  ['documents', 'data/documents.json', 'documents added to a case (the files are in documents/)'],
  ['clips', 'data/clips.json', 'technique clips (the videos are in clips/)'],
  ['auditEntries', 'data/audit-entries.json', 'entries of the audit trail about this person that you may see'],
];

export interface RecordZipMeta {
  organizationName: string;
  requestedByName: string;
  preparedAt: Date;
}

function readMe(contents: RecordContents, meta: RecordZipMeta): string {
  const lines = [
    `The record Loadline holds about ${contents.athleteName}`,
    '',
    `Prepared ${meta.preparedAt.toISOString()} (UTC) for ${meta.requestedByName}, from ${meta.organizationName}.`,
    'It holds what you may see in Loadline yourself: the same parts, with the same parts left out.',
    '',
    'What is inside',
    ...DATA_FILES.map(([key, file, what]) => {
      const value = contents.data[key];
      const count = Array.isArray(value) ? ` (${value.length})` : '';
      return `- ${file}${count}: ${what}`;
    }),
    '',
    'The data files are JSON (RFC 8259), in UTF-8. Dates are YYYY-MM-DD; times are ISO 8601 in UTC; loads are in kg.',
    'Questions about what this record says about an injury or a return to sport belong with the clinician',
    'who cares for the athlete.',
    '',
  ];
  return lines.join('\n');
}

function missingNote(paths: string[]): string {
  return [
    'These files are listed in the data files but could not be read from storage when this copy was made:',
    ...paths.map((p) => `- ${p}`),
    '',
    'Ask your organization about them.',
    '',
  ].join('\n');
}

/**
 * Writes the archive to a temporary file (so its size and SHA-256 are known before it is stored) and
 * returns them; the caller removes the folder. Stored files are streamed from storage one at a time,
 * so a record with long clips never sits in memory.
 */
export async function writeRecordZip(
  contents: RecordContents,
  meta: RecordZipMeta,
  storage: ObjectStorage,
): Promise<{ dir: string; file: string; size: number; sha256: string }> {
  const dir = await mkdtemp(path.join(os.tmpdir(), 'loadline-record-'));
  const file = path.join(dir, 'record.zip');
  try {
    const zip = new ZipArchive({ zlib: { level: 6 } });
    const written = pipeline(zip, createWriteStream(file));
    // Entries are written in order; a stored file is opened only once those before it are in, so a
    // record with many clips holds one file (or one S3 response) open at a time, never all of them.
    let appended = 0;
    let done = 0;
    const waiters: (() => void)[] = [];
    zip.on('entry', () => {
      done += 1;
      if (done === appended) waiters.splice(0).forEach((w) => w());
    });
    const caughtUp = () => (done === appended ? Promise.resolve() : Promise.race([new Promise<void>((r) => waiters.push(r)), written]));
    const add = (source: Parameters<ZipArchive['append']>[0], name: string, store = false) => {
      appended += 1;
      zip.append(source, { name, store });
    };
    add(readMe(contents, meta), 'README.txt');
    for (const [key, name] of DATA_FILES) add(`${JSON.stringify(contents.data[key], null, 2)}\n`, name);
    // PDFs and videos are compressed already: stored as they are.
    for (const l of contents.letterPdfs) add(l.pdf, l.path, true);
    // A file gone from storage (removed by hand, a lost disk) must not keep the rest of the record
    // from its owner: it is named in MISSING.txt instead, and the copy is still made.
    const missing: string[] = [];
    for (const s of contents.stored) {
      await caughtUp();
      const body = await storage.get(s.storageKey).catch(() => null);
      if (body) add(body, s.path, true);
      else missing.push(s.path);
    }
    if (missing.length) add(missingNote(missing), 'MISSING.txt');
    await zip.finalize();
    await written;
    const hash = createHash('sha256');
    await pipeline(createReadStream(file), hash);
    return { dir, file, size: (await stat(file)).size, sha256: hash.digest('hex') };
  } catch (err) {
    await rm(dir, { recursive: true, force: true });
    throw err;
  }
}
