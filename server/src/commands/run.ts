import type { EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import { orgToday } from '../../../policies/today';
import type { ActorWithOrg } from '../services/actor';
import type {
  Command,
  CommandCtx,
  CoreDeps,
  LimitsChange,
  OrgCommandCtx,
  PublicQuery,
  Query,
  QueryCtx,
  RecheckSummary,
} from '../core/command';
import { auditFor } from '../core/tx';
import { applyLimitsChange } from './limits';

export interface Caller {
  deps: CoreDeps;
  requestId: string;
  userId: string | null;
}

export interface OrgCaller extends Caller {
  userId: string;
  actor: ActorWithOrg;
  ability: AppAbility;
}

/** Raised when a command declared as changing limits returned without reporting: a programming error, never committed. */
export class LimitsNotReported extends Error {
  constructor(name: string) {
    super(`${name} is declared as changing limits but reported neither limitsChanged nor limitsUnchanged`);
  }
}

interface Tracker {
  reported: boolean;
}

function baseCtx(m: EntityManager, caller: Caller, organizationId: string | null, timeZone: string | null, tracker: Tracker): CommandCtx {
  const now = new Date();
  return {
    m,
    audit: auditFor(m, caller.requestId, caller.userId, organizationId),
    deps: caller.deps,
    requestId: caller.requestId,
    userId: caller.userId,
    now,
    async limitsChanged(change: LimitsChange): Promise<RecheckSummary> {
      tracker.reported = true;
      if (!organizationId) throw new Error('limitsChanged needs an organization');
      return applyLimitsChange(m, organizationId, orgToday(timeZone ?? 'UTC', now), change);
    },
    limitsUnchanged() {
      tracker.reported = true;
    },
  };
}

function orgCtx(m: EntityManager, caller: OrgCaller, tracker: Tracker): OrgCommandCtx {
  const base = baseCtx(m, caller, caller.actor.organizationId, caller.actor.timeZone, tracker);
  return { ...base, userId: caller.userId, actor: caller.actor, ability: caller.ability, today: orgToday(caller.actor.timeZone, base.now) };
}

function checkReported(cmd: Command<any, any, any>, tracker: Tracker) {
  if (cmd.changesLimits && !tracker.reported) throw new LimitsNotReported(cmd.name);
}

/** Runs an organization command in a transaction of its own: the change, its audit entries and its holds commit together. */
export async function runOrgCommand<I, O>(cmd: Command<I, O, OrgCommandCtx>, caller: OrgCaller, input: I): Promise<O> {
  const result = await caller.deps.ds.transaction(async (m) => {
    const tracker: Tracker = { reported: false };
    const out = await cmd.run(orgCtx(m, caller, tracker), input);
    checkReported(cmd, tracker);
    return out;
  });
  // A changed role, care team or ended session applies to this server's very next request.
  await caller.deps.actorChanges?.settle();
  return result;
}

/**
 * Runs an organization command inside a transaction the caller already holds (the demo loader runs
 * its whole story in one, so a failed load leaves nothing half-made). The same checks as
 * runOrgCommand apply.
 */
export async function runOrgCommandIn<I, O>(m: EntityManager, cmd: Command<I, O, OrgCommandCtx>, caller: OrgCaller, input: I): Promise<O> {
  const tracker: Tracker = { reported: false };
  const out = await cmd.run(orgCtx(m, caller, tracker), input);
  checkReported(cmd, tracker);
  return out;
}

/** Runs a command that needs no membership, in a transaction of its own. */
export async function runPublicCommand<I, O>(
  cmd: Command<I, O, CommandCtx>,
  caller: Caller,
  input: I,
  organizationId: string | null = null,
): Promise<O> {
  const result = await caller.deps.ds.transaction(async (m) => {
    const tracker: Tracker = { reported: false };
    const out = await cmd.run(baseCtx(m, caller, organizationId, null, tracker), input);
    checkReported(cmd, tracker);
    return out;
  });
  // A password reset's ended sessions are gone from this server's cache before it answers.
  await caller.deps.actorChanges?.settle();
  return result;
}

/**
 * One command inside another's transaction (e.g. an emergency pain report sets the status): the
 * inner command reports its own limits; the outer one still has to report for itself.
 */
export async function callWithin<I, O>(ctx: OrgCommandCtx, cmd: Command<I, O, OrgCommandCtx>, input: I): Promise<O> {
  const tracker: Tracker = { reported: false };
  const inner: OrgCommandCtx = {
    ...ctx,
    async limitsChanged(change) {
      tracker.reported = true;
      return ctx.limitsChanged(change);
    },
    limitsUnchanged() {
      tracker.reported = true;
    },
  };
  const out = await cmd.run(inner, input);
  checkReported(cmd, tracker);
  return out;
}

/** Runs a read with the reader's ability and the organization's today. */
export async function runOrgQuery<I, O>(q: Query<I, O>, caller: OrgCaller, input: I, db: QueryCtx['db'] = caller.deps.ds): Promise<O> {
  const now = new Date();
  return q.run(
    {
      db,
      deps: caller.deps,
      userId: caller.userId,
      actor: caller.actor,
      ability: caller.ability,
      now,
      today: orgToday(caller.actor.timeZone, now),
    },
    input,
  );
}

/** Runs a read open to anyone (no reader, so no ability: the query itself must reveal nothing private). */
export async function runPublicQuery<I, O>(q: PublicQuery<I, O>, deps: CoreDeps, input: I): Promise<O> {
  return q.run({ db: deps.ds, deps, now: new Date() }, input);
}
