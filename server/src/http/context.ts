import type { Request, Response } from 'express';
import type { DataSource, EntityManager } from 'typeorm';
import type { Logger } from 'pino';
import type { buildPassport as buildPassportType } from './security';
import type { JobQueue } from '../jobs/queue';
import type { AppAbility } from '../../../policies/access';
import type { Config } from '../config';
import type { User } from '../entities';
import type { ActorWithOrg } from '../services/actor';
import type { ObjectStorage } from '../storage';
import { appendAudit, type AuditInput } from '../services/audit';

export interface Deps {
  ds: DataSource;
  config: Config;
  logger: Logger;
  passport: ReturnType<typeof buildPassportType>;
  /** The job queue, when e-mail is configured. */
  jobs: JobQueue | null;
  /** Where uploaded files live (local disk or the S3 API). */
  storage: ObjectStorage;
}

/** Writes an audit entry in the surrounding transaction; actor, organization and request id are filled in. */
export type AuditFn = (entry: Omit<AuditInput, 'requestId' | 'actorUserId' | 'organizationId'> & Partial<AuditInput>) => Promise<void>;
export type TxFn = <T>(work: (m: EntityManager, audit: AuditFn) => Promise<T>) => Promise<T>;

export interface BaseCtx<P, Q, B> {
  req: Request;
  res: Response;
  deps: Deps;
  ds: DataSource;
  requestId: string;
  user: User | null;
  params: P;
  query: Q;
  body: B;
  /** Runs `work` in one transaction; entries written through its `audit` commit or roll back with it. */
  tx: TxFn;
}

export interface OrgCtx<P, Q, B> extends BaseCtx<P, Q, B> {
  user: User;
  actor: ActorWithOrg;
  ability: AppAbility;
}

export function makeTx(ds: DataSource, requestId: string, actorUserId: string | null, organizationId: string | null): TxFn {
  return (work) =>
    ds.transaction((m) => work(m, (entry) => appendAudit(m, { organizationId, actorUserId, requestId, ...entry })));
}
