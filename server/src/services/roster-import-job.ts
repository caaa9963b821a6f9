import { randomUUID } from 'node:crypto';
import { setImmediate as yieldToRequests } from 'node:timers/promises';
import { defineAbilityFor } from '../../../policies/access';
import { RosterImport } from '../entities';
import type { CoreDeps } from '../core/command';
import { AppError } from '../core/errors';
import { failRosterImport, importRosterBatch } from '../commands/roster';
import { runOrgCommand, type OrgCaller } from '../commands/run';
import { loadActor } from './actor';

/**
 * Works one roster import to the end, batch after batch, as the admin who started it: each batch is
 * the same command with the same checks and audit entries as any write, and between batches the event
 * loop serves requests, so a 2,000-row file never holds the server. Run by the pg-boss worker
 * (server.ts), or in the background of the start request when no queue is configured. An admin who is
 * no longer an admin stops the import; an unexpected error marks it failed, and starting it again
 * resumes after the last committed batch.
 */
export async function runRosterImport(deps: CoreDeps, importId: string): Promise<void> {
  const row = await deps.ds
    .getRepository(RosterImport)
    .findOne({ where: { id: importId }, select: { id: true, organizationId: true, createdBy: true, status: true } });
  if (!row || !row.createdBy || (row.status !== 'queued' && row.status !== 'running')) return;
  const actor = await loadActor(deps.ds, row.createdBy, row.organizationId);
  if (!actor) return;
  const caller: OrgCaller = { deps, requestId: `roster-${randomUUID()}`, userId: row.createdBy, actor, ability: defineAbilityFor(actor) };
  try {
    for (;;) {
      const { more } = await runOrgCommand(importRosterBatch, caller, { id: importId });
      if (!more) return;
      await yieldToRequests();
    }
  } catch (err) {
    deps.logger.warn({ err, importId }, 'roster import stopped');
    // Our own refusals are sentences for people; anything else is not shown (it may hold database detail).
    const message = err instanceof AppError ? err.message : 'An unexpected error stopped the import. Start it again to resume.';
    await runOrgCommand(failRosterImport, caller, { id: importId, error: message });
  }
}
