import type { DataSource, EntityManager } from 'typeorm';
import type { Logger } from 'pino';
import type { AppAbility } from '../../../policies/access';
import type { Config } from '../config';
import type { JobQueue } from '../jobs/queue';
import type { ObjectStorage } from '../storage';
import type { ActorWithOrg } from '../services/actor';
import type { AuditFn } from './tx';

/** What the framework-free core needs from the running server: no express, no request. */
export interface CoreDeps {
  ds: DataSource;
  config: Config;
  logger: Logger;
  /** The job queue, when e-mail is configured. */
  jobs: JobQueue | null;
  /** Where uploaded files live (local disk or the S3 API). */
  storage: ObjectStorage;
  /**
   * The server's cache of signed-in actors (http/actor-cache.ts): after a write commits, `settle` waits
   * until the cache has heard of every change committed so far. Absent outside a running app.
   */
  actorChanges?: { settle(): Promise<void> };
}

/**
 * Something that changed what an athlete may do. Every command that may change limits reports it
 * through `ctx.limitsChanged` (or says `ctx.limitsUnchanged()` for an input that did not), and the
 * runner refuses to commit a command that declared `changesLimits` and reported neither.
 */
export type LimitsChange =
  | { athleteIds: string[]; reason: string }
  /** An exercise's patterns, impact flag or reference lift changed: every athlete with sessions using it. */
  | { exerciseId: string; reason: string };

export interface RecheckSummary {
  /** Sessions newly put on hold, per athlete. */
  held: { athleteId: string; sessionIds: string[] }[];
  /** Sessions that fit again and came off hold, per athlete. */
  released: { athleteId: string; sessionIds: string[] }[];
}

/** Who runs a command and the transaction it runs in. */
export interface CommandCtx {
  m: EntityManager;
  /** Writes an audit entry in this transaction (actor, organization and request id filled in). */
  audit: AuditFn;
  deps: CoreDeps;
  requestId: string;
  /** The signed-in user, when there is one. */
  userId: string | null;
  /** The instant the command runs (tests pin it with fake timers). */
  now: Date;
  limitsChanged(change: LimitsChange): Promise<RecheckSummary>;
  /** This input changed nothing an athlete may do (e.g. a pain report without an emergency answer). */
  limitsUnchanged(): void;
}

/** A command run by a member of an organization. */
export interface OrgCommandCtx extends CommandCtx {
  userId: string;
  actor: ActorWithOrg;
  ability: AppAbility;
  /** The organization's local day (policies/today.ts). */
  today: string;
}

export interface Command<I, O, C extends CommandCtx = OrgCommandCtx> {
  readonly kind: 'command';
  readonly name: string;
  readonly scope: C extends OrgCommandCtx ? 'org' : 'anyone';
  /** The command may change what an athlete may do: it must report through `limitsChanged`. */
  readonly changesLimits: boolean;
  run(ctx: C, input: I): Promise<O>;
}

export type AnyCommand = Command<any, any, any>;

/** A write by a member of an organization: plain function of (context, validated input). */
export function orgCommand<I, O>(def: {
  name: string;
  changesLimits?: boolean;
  run(ctx: OrgCommandCtx, input: I): Promise<O>;
}): Command<I, O, OrgCommandCtx> {
  return { kind: 'command', scope: 'org', changesLimits: def.changesLimits ?? false, name: def.name, run: def.run } as Command<
    I,
    O,
    OrgCommandCtx
  >;
}

/** A write that needs no organization membership (sign-in, reset, accepting an invitation…). */
export function publicCommand<I, O>(def: { name: string; run(ctx: CommandCtx, input: I): Promise<O> }): Command<I, O, CommandCtx> {
  return { kind: 'command', scope: 'anyone', changesLimits: false, name: def.name, run: def.run } as unknown as Command<I, O, CommandCtx>;
}

/** What a read needs: a connection (or the surrounding transaction), and who is reading. */
export interface QueryCtx {
  db: DataSource | EntityManager;
  deps: CoreDeps;
  userId: string;
  actor: ActorWithOrg;
  ability: AppAbility;
  /** The organization's local day (policies/today.ts). */
  today: string;
  now: Date;
}

export interface Query<I, O> {
  readonly kind: 'query';
  readonly name: string;
  run(ctx: QueryCtx, input: I): Promise<O>;
}

/** A read by a member of an organization; it filters with the reader's ability (core/accessible.ts). */
export function orgQuery<I, O>(def: { name: string; run(ctx: QueryCtx, input: I): Promise<O> }): Query<I, O> {
  return { kind: 'query', name: def.name, run: def.run };
}

/** What a read open to anyone needs (the public letter check): a connection and the clock, no reader. */
export interface PublicQueryCtx {
  db: DataSource | EntityManager;
  deps: CoreDeps;
  now: Date;
}

export interface PublicQuery<I, O> {
  readonly kind: 'public-query';
  readonly name: string;
  run(ctx: PublicQueryCtx, input: I): Promise<O>;
}

/** A read that needs no membership; it must reveal nothing a stranger may not see. */
export function publicQuery<I, O>(def: { name: string; run(ctx: PublicQueryCtx, input: I): Promise<O> }): PublicQuery<I, O> {
  return { kind: 'public-query', name: def.name, run: def.run };
}
