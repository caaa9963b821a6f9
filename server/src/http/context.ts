import type { Request, Response } from 'express';
import type { buildPassport as buildPassportType } from './security';
import type { AppAbility } from '../../../policies/access';
import type { User } from '../entities';
import type { ActorWithOrg } from '../services/actor';
import type { AnyCommand, Command, CommandCtx, CoreDeps, OrgCommandCtx, PublicQuery, Query } from '../core/command';
export { makeTx, type AuditFn, type TxFn } from '../core/tx';

/** The core's dependencies plus what only the HTTP layer uses (passport). */
export interface Deps extends CoreDeps {
  passport: ReturnType<typeof buildPassportType>;
}

export interface BaseCtx<P, Q, B> {
  req: Request;
  res: Response;
  /** For the HTTP layer's own needs (passport, sessions); routers reach data only through run/read. */
  deps: Deps;
  requestId: string;
  user: User | null;
  params: P;
  query: Q;
  body: B;
  /** Runs a command that needs no membership (sign-in, reset…) in a transaction of its own. */
  run<I, O>(cmd: Command<I, O, CommandCtx>, input: I, organizationId?: string | null): Promise<O>;
  /** Runs a read open to anyone (the public letter check). */
  readPublic<I, O>(q: PublicQuery<I, O>, input: I): Promise<O>;
}

export interface OrgCtx<P, Q, B> extends Omit<BaseCtx<P, Q, B>, 'run'> {
  user: User;
  actor: ActorWithOrg;
  ability: AppAbility;
  /** Runs one of the route's declared commands as this member, in a transaction of its own. */
  run<I, O>(cmd: Command<I, O, OrgCommandCtx>, input: I): Promise<O>;
  /** Runs a read as this member (their ability filters it; their organization's today). */
  read<I, O>(q: Query<I, O>, input: I): Promise<O>;
}

export type { AnyCommand };
