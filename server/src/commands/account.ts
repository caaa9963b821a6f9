import type { EntityManager } from 'typeorm';
import { defineAbilityFor, type Actor } from '../../../policies/access';
import type { UserDto } from '../../../policies/dto';
import type { ProfileUpdateInput } from '../../../policies/schemas';
import { User } from '../entities';
import { publicCommand, type CommandCtx } from '../core/command';
import { AppError } from '../core/errors';
import { authorize } from '../core/authorize';
import { loadActors } from '../services/actor';
import { passwordMatches } from '../services/passwords';
import { isTwoStepOn, twoStepKey, useSecondStepCode } from '../services/two-step';
import { toUserDto } from '../queries/account';

/**
 * The person's own account: signing in and out, their profile. The session itself (passport's
 * login, a new session id, the CSRF token) is the HTTP layer's: http/sign-in.ts does it with what
 * these commands answer.
 */

/** The signed-in caller of a command for one's own account (the route's `signedIn` access makes it so). */
export function accountHolder(ctx: CommandCtx): string {
  if (!ctx.userId) throw new AppError('unauthenticated', 'Please sign in to continue.');
  return ctx.userId;
}

/**
 * An event about a person's own account (sign-in, password reset, two-step sign-in), written into
 * the trail of each organization they belong to, or the global trail when they belong to none.
 */
const NOBODY = '00000000-0000-0000-0000-000000000000';

export async function auditAccount(
  ctx: CommandCtx,
  e: { action: string; userId: string | null; actorUserId?: string | null; after?: unknown },
): Promise<void> {
  // The lookup runs for an unknown e-mail too (with an id nobody has), so a failed sign-in costs the
  // same queries whether or not the account exists (ASVS 5.0 V6.3.8: no enumeration by timing).
  const actors = await loadActors(ctx.m, e.userId ?? NOBODY);
  const orgs: (string | null)[] = actors.length ? actors.map((a) => a.organizationId) : [null];
  for (const organizationId of orgs) {
    await ctx.audit({
      organizationId,
      actorUserId: e.actorUserId === undefined ? e.userId : e.actorUserId,
      action: e.action,
      subjectType: 'User',
      subjectId: e.userId,
      after: e.after ?? null,
    });
  }
}

/**
 * Ends every session of a person except `keepSid`: signed-in ones (passport's user in the session
 * JSON, indexed) and ones waiting for a second-step code: after a password reset (ASVS 5.0 V7.4.3),
 * when a member is removed (V7.4.2) and when their roles change, so they sign in again under a new
 * session id (V7.2.4).
 */
export async function endSessionsOf(m: EntityManager, userId: string, keepSid: string | null): Promise<number> {
  const signedIn: [unknown, number] = await m.query(
    `DELETE FROM "session" WHERE (sess -> 'passport' ->> 'user') = $1 AND sid IS DISTINCT FROM $2`,
    [userId, keepSid],
  );
  const pending: [unknown, number] = await m.query(
    `DELETE FROM "session" WHERE (sess -> 'pendingSignIn' ->> 'userId') = $1 AND sid IS DISTINCT FROM $2`,
    [userId, keepSid],
  );
  return signedIn[1] + pending[1];
}

/**
 * A second-step code (app code or recovery code) checked in the command's transaction; a recovery
 * code that worked is used up and audited. Answers which kind worked, or null.
 */
export async function useAuditedSecondStepCode(ctx: CommandCtx, userId: string, code: string) {
  const kind = await useSecondStepCode(ctx.m, twoStepKey(ctx.deps.config), userId, code);
  if (kind === 'recovery_code') await auditAccount(ctx, { action: 'auth.recovery_code_used', userId });
  return kind;
}

export type SignInOutcome = { user: null } | { user: User; secondStep: boolean };

/**
 * The password step of signing in. Unknown e-mail and wrong password take the same time and give the
 * same answer (ASVS 5.0 V6.3.8); the failure is audited with the e-mail tried, never the password.
 * With two-step sign-in on, the person is not signed in yet: a code must follow (finishSignIn).
 */
export const signIn = publicCommand({
  name: 'signIn',
  async run(ctx, input: { email: string; password: string }): Promise<SignInOutcome> {
    const user = await ctx.m.findOne(User, { where: { email: input.email } });
    if (!(await passwordMatches(input.password, user?.passwordHash, ctx.deps.config.BCRYPT_COST)) || !user) {
      // Against a member's e-mail: in each of their organizations' trails, so their admins see the
      // attempts (ASVS 5.0 V16.3.1); the actor is unknown, never the account's owner.
      await auditAccount(ctx, {
        action: 'auth.sign_in_failed',
        userId: user?.id ?? null,
        actorUserId: null,
        after: { email: input.email },
      });
      return { user: null };
    }
    const secondStep = await isTwoStepOn(ctx.m, user.id);
    await auditAccount(ctx, { action: secondStep ? 'auth.second_step_needed' : 'auth.signed_in', userId: user.id });
    return { user, secondStep };
  },
});

/** The second step: a current app code or an unused recovery code for the person whose password was right. */
export const finishSignIn = publicCommand({
  name: 'finishSignIn',
  async run(ctx, input: { userId: string; email: string; code: string }): Promise<User | null> {
    const used = await useAuditedSecondStepCode(ctx, input.userId, input.code);
    const user = used ? await ctx.m.findOne(User, { where: { id: input.userId } }) : null;
    if (!user) {
      await auditAccount(ctx, {
        action: 'auth.sign_in_failed',
        userId: input.userId,
        actorUserId: null,
        after: { email: input.email, step: 'second' },
      });
      return null;
    }
    await auditAccount(ctx, { action: 'auth.signed_in', userId: user.id, after: { secondStep: used! } });
    return user;
  },
});

/** Written before the session row goes (the HTTP layer deletes it). */
export const signOut = publicCommand({
  name: 'signOut',
  async run(ctx, _input: void): Promise<void> {
    await auditAccount(ctx, { action: 'auth.signed_out', userId: accountHolder(ctx) });
  },
});

/** A person changes their own display name or unit; the field rules of policies/access decide what they may set. */
export const updateProfile = publicCommand({
  name: 'updateProfile',
  async run(ctx, input: ProfileUpdateInput): Promise<UserDto> {
    const userId = accountHolder(ctx);
    const selfOnly: Actor = { userId, organizationId: '', membershipId: '', roles: [], coachOf: [], clinicianOf: [], guardianOf: [] };
    const ability = defineAbilityFor(selfOnly);
    for (const field of Object.keys(input)) authorize(ability, 'update', 'User', { id: userId }, field);
    const me = await ctx.m.findOneByOrFail(User, { id: userId });
    const before = { displayName: me.displayName, unitPref: me.unitPref };
    await ctx.m.update(User, { id: userId }, input);
    const after = await ctx.m.findOneByOrFail(User, { id: userId });
    await ctx.audit({ organizationId: null, action: 'user.updated', subjectType: 'User', subjectId: userId, before, after: input });
    return toUserDto(after);
  },
});
