import { SignInSchema, ProfileUpdateSchema, SecondStepSchema } from '../../../../policies/schemas';
import { defineAbilityFor, type Actor } from '../../../../policies/access';
import { publicRoute, type RouteDef } from '../../http/route';
import type { Deps } from '../../http/context';
import { SESSION_COOKIE } from '../../http/security';
import { AppError } from '../../core/errors';
import { sessionDto, toUserDto } from '../../services/session-dto';
import {
  accountLimits,
  auditSignIn,
  authenticateLocal,
  beginSecondStep,
  invalidCredentials,
  pendingSecondStep,
  sessionWithStep,
  startSession,
  useAuditedSecondStepCode,
} from '../../services/sign-in';
import { isTwoStepOn, twoStepKey } from '../../services/two-step';
import { authorize } from '../../core/authorize';
import { User } from '../../entities';

const wrongCode = () =>
  new AppError('invalid_credentials', 'That code did not work. Enter the code your app shows now, or one of your unused recovery codes.');
const stepTimedOut = () =>
  new AppError('unauthenticated', 'Your sign-in timed out before a code was entered. Please enter your e-mail and password again.');

export function sessionRoutes(deps: Deps): RouteDef[] {
  const limits = accountLimits(deps);
  return [
    publicRoute({
      method: 'get',
      path: '/session',
      summary: 'Who am I, my organizations and roles, and the CSRF token for writes',
      access: { kind: 'public' },
      async handler({ ds, req }) {
        return sessionWithStep(ds, req);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/session',
      summary: 'Sign in with e-mail and password (with two-step sign-in on: only as far as the second step)',
      access: { kind: 'public' },
      before: limits,
      body: SignInSchema,
      async handler({ req, res, ds, body, requestId }) {
        const user = await authenticateLocal(deps, req, res);
        if (!user) {
          await auditSignIn(deps, requestId, 'auth.sign_in_failed', null, body.email).catch(() => undefined);
          throw invalidCredentials();
        }
        if (await isTwoStepOn(ds.manager, user.id)) {
          await beginSecondStep(req, user);
          await auditSignIn(deps, requestId, 'auth.second_step_needed', user, body.email);
          return sessionWithStep(ds, req);
        }
        await startSession(req, user);
        await auditSignIn(deps, requestId, 'auth.signed_in', user, body.email);
        return sessionDto(ds, req);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/session/second-step',
      summary: 'Finish signing in with a code from the authenticator app or a recovery code',
      access: { kind: 'public' },
      before: limits,
      body: SecondStepSchema,
      async handler({ req, ds, body, requestId }) {
        const pending = pendingSecondStep(req);
        if (!pending) throw stepTimedOut();
        const key = twoStepKey(deps.config);
        const used = await ds.transaction((m) => useAuditedSecondStepCode(m, key, pending.userId, body.code, requestId));
        const user = used ? await ds.getRepository(User).findOne({ where: { id: pending.userId } }) : null;
        if (!user) {
          await auditSignIn(deps, requestId, 'auth.sign_in_failed', null, pending.email, { step: 'second' }).catch(() => undefined);
          throw wrongCode();
        }
        // passport's login regenerates the session id: the pending marker goes with the old one.
        await startSession(req, user);
        await auditSignIn(deps, requestId, 'auth.signed_in', user, pending.email, { secondStep: used! });
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
        const selfOnly: Actor = {
          userId: me.id,
          organizationId: '',
          membershipId: '',
          roles: [],
          coachOf: [],
          clinicianOf: [],
          guardianOf: [],
        };
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
