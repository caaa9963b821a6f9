import { SignInSchema, ProfileUpdateSchema } from '../../../../policies/schemas';
import { defineAbilityFor, type Actor } from '../../../../policies/access';
import { publicRoute, type RouteDef } from '../../http/route';
import type { Deps } from '../../http/context';
import { signInLimits, SESSION_COOKIE } from '../../http/security';
import { sessionDto, toUserDto } from '../../services/session-dto';
import { auditSignIn, authenticateLocal, invalidCredentials, startSession } from '../../services/sign-in';
import { authorize } from '../../http/authorize';
import { User } from '../../entities';

export function sessionRoutes(deps: Deps): RouteDef[] {
  return [
    publicRoute({
      method: 'get',
      path: '/session',
      summary: 'Who am I, my organizations and roles, and the CSRF token for writes',
      access: { kind: 'public' },
      async handler({ ds, req }) {
        return sessionDto(ds, req);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/session',
      summary: 'Sign in with e-mail and password',
      access: { kind: 'public' },
      before: signInLimits(deps),
      body: SignInSchema,
      async handler({ req, res, ds, body, requestId }) {
        const user = await authenticateLocal(deps, req, res);
        if (!user) {
          await auditSignIn(deps, requestId, 'auth.sign_in_failed', null, body.email).catch(() => undefined);
          throw invalidCredentials();
        }
        await startSession(req, user);
        await auditSignIn(deps, requestId, 'auth.signed_in', user, body.email);
        return sessionDto(ds, req);
      },
    }),
    publicRoute({
      method: 'delete',
      path: '/session',
      summary: 'Sign out: the session row is deleted',
      access: { kind: 'signedIn' },
      async handler({ req, res, user, requestId }) {
        await auditSignIn(deps, requestId, 'auth.signed_out', user, user!.email);
        await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
        await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
        res.clearCookie(SESSION_COOKIE, { path: '/' });
        return undefined;
      },
    }),
    publicRoute({
      method: 'patch',
      path: '/me',
      summary: 'Change my display name or unit preference',
      access: { kind: 'signedIn' },
      body: ProfileUpdateSchema,
      async handler({ user, body, tx }) {
        const me = user!;
        const selfOnly: Actor = { userId: me.id, organizationId: '', membershipId: '', roles: [], coachOf: [], clinicianOf: [], guardianOf: [] };
        const ability = defineAbilityFor(selfOnly);
        for (const field of Object.keys(body)) authorize(ability, 'update', 'User', { id: me.id }, field);
        return tx(async (m, audit) => {
          const before = { displayName: me.displayName, unitPref: me.unitPref };
          await m.update(User, { id: me.id }, body);
          const after = await m.findOneByOrFail(User, { id: me.id });
          await audit({ organizationId: null, action: 'user.updated', subjectType: 'User', subjectId: me.id, before, after: body });
          return toUserDto(after);
        });
      },
    }),
  ];
}
