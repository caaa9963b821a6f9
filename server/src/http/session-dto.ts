import type { Request } from 'express';
import type { SessionDto } from '../../../policies/dto';
import type { User } from '../entities';
import type { CoreDeps } from '../core/command';
import { sessionMemberships, toUserDto } from '../queries/account';
import { ensureCsrfToken, signedOutCsrfToken } from './csrf';
import { pendingSecondStep } from './sign-in';

/**
 * The session as the client sees it: who is signed in, their memberships, and the CSRF token for
 * writes. A caller with no session gets a signed-out token (http/csrf.ts), so asking writes no
 * session row.
 */
export async function sessionDto(deps: Pick<CoreDeps, 'ds'>, req: Request): Promise<SessionDto> {
  const user = (req.user as User | undefined) ?? null;
  const csrfToken = user || req.session?.csrfToken ? ensureCsrfToken(req) : signedOutCsrfToken(req, req.res!);
  if (!user) return { user: null, memberships: [], csrfToken };
  return { user: toUserDto(user), csrfToken, memberships: await sessionMemberships(deps.ds, user.id) };
}

/** The same, saying so when a second-step code is awaited. */
export async function sessionWithStep(deps: Pick<CoreDeps, 'ds'>, req: Request): Promise<SessionDto> {
  const dto = await sessionDto(deps, req);
  return pendingSecondStep(req) ? { ...dto, secondStep: true } : dto;
}
