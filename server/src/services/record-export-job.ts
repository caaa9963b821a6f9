/**
 * The background half of a person's whole record, exported on request (GDPR Art. 15 and 20): read the record
 * with the requester's own rules, write the ZIP, store it, then record it, make its link and e-mail it in one
 * transaction (commands/record-exports.ts finishRecordExport). Run by pg-boss (jobs/queue.ts), so a request
 * survives a crash; a retried job for a request already finished does nothing.
 */
import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { rm } from 'node:fs/promises';
import { asSubject, defineAbilityFor } from '../../../policies/access';
import { orgToday } from '../../../policies/today';
import { RecordExport, User } from '../entities';
import type { CoreDeps } from '../core/command';
import { failRecordExport, finishRecordExport } from '../commands/record-exports';
import { runPublicCommand } from '../commands/run';
import { recordContents, recordExportSubject } from '../queries/record-export';
import { loadActor } from './actor';
import { writeRecordZip } from './record-export';

/** A key of its own per run, so a second run of the same request never overwrites or removes the first's copy. */
export const recordExportKey = (id: string) => `record-exports/${id}/${randomUUID()}`;

/** The sentence a request shows when the person may no longer ask for it (a ward came of age, a link was removed). */
export const NO_LONGER_ALLOWED = 'You may no longer ask for this record, so no copy was made.';
export const COULD_NOT_PREPARE = 'The copy could not be prepared. Ask again; if it fails again, tell your organization.';

/**
 * Copies whose link has expired are removed from storage (the request row stays, for the account page
 * and the trail): nobody may download them any more, so they are not kept. Run before each build.
 */
export async function sweepExpiredCopies(deps: CoreDeps, now = new Date()): Promise<number> {
  const expired = await deps.ds.query<{ id: string; storage_key: string }[]>(
    `SELECT id, storage_key FROM record_exports WHERE status = 'ready' AND storage_key IS NOT NULL AND expires_at <= $1 LIMIT 100`,
    [now.toISOString()],
  );
  for (const r of expired) {
    await deps.storage.delete(r.storage_key);
    await deps.ds.query(`UPDATE record_exports SET storage_key = NULL WHERE id = $1`, [r.id]);
  }
  return expired.length;
}

/**
 * Builds one request's copy. `lastTry` is pg-boss's final attempt: a failure then marks the request
 * failed (so the account page stops saying "preparing") before it is rethrown for the log.
 */
export async function buildRecordExport(deps: CoreDeps, exportId: string, lastTry = false): Promise<void> {
  await sweepExpiredCopies(deps);
  const caller = { deps, requestId: `record-export-${exportId}`, userId: null };
  const r = await deps.ds.getRepository(RecordExport).findOne({ where: { id: exportId } });
  if (r?.status !== 'queued') return;
  try {
    // Loaded now, not when asked: a guardian unlinked (or an athlete come of age) meanwhile gets nothing.
    const actor = await loadActor(deps.ds, r.requestedBy, r.organizationId);
    const now = new Date();
    const today = actor ? orgToday(actor.timeZone, now) : '';
    const ability = defineAbilityFor(actor);
    const subject = await recordExportSubject(deps.ds, r.organizationId, r.athleteId, today, r.requestedBy);
    if (!actor || !ability.can('create', asSubject('RecordExport', subject))) {
      await runPublicCommand(failRecordExport, caller, { id: r.id, problem: NO_LONGER_ALLOWED }, r.organizationId);
      return;
    }
    const contents = await recordContents({ db: deps.ds, deps, userId: r.requestedBy, actor, ability, now, today }, r.athleteId);
    const requester = await deps.ds.getRepository(User).findOneByOrFail({ id: r.requestedBy });
    const zip = await writeRecordZip(
      contents,
      { organizationName: actor.organizationName, requestedByName: requester.displayName, preparedAt: now },
      deps.storage,
    );
    const key = recordExportKey(r.id);
    try {
      await deps.storage.put(key, createReadStream(zip.file), { size: zip.size, contentType: 'application/zip' });
    } finally {
      await rm(zip.dir, { recursive: true, force: true });
    }
    try {
      const finished = await runPublicCommand(
        finishRecordExport,
        caller,
        {
          id: r.id,
          storageKey: key,
          sizeBytes: zip.size,
          sha256: zip.sha256,
          organizationName: actor.organizationName,
          timeZone: actor.timeZone,
        },
        r.organizationId,
      );
      // Another run finished it first: its copy is the one on record, this one goes.
      if (!finished) await deps.storage.delete(key);
    } catch (err) {
      await deps.storage.delete(key);
      throw err;
    }
  } catch (err) {
    deps.logger.error({ err, exportId }, 'record export failed');
    if (lastTry) await runPublicCommand(failRecordExport, caller, { id: r.id, problem: COULD_NOT_PREPARE }, r.organizationId);
    throw err;
  }
}
