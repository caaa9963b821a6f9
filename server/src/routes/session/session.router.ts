import { NothingSchema, ProfileUpdateSchema, SecondStepSchema, SignInSchema } from '../../../../policies/schemas';
import { publicRoute, type RouteDef } from '../../http/route';
import type { Deps } from '../../http/context';
import { AppError } from '../../core/errors';
import { sessionDto, sessionWithStep } from '../../http/session-dto';
import { accountLimits, beginSecondStep, endSession, pendingSecondStep, startSession } from '../../http/sign-in';
import { finishSignIn, signIn, signOut, updateProfile } from '../../commands/account';

const invalidCredentials = () => new AppError('invalid_credentials', 'E-mail or password is incorrect.');
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
      params: NothingSchema,
      query: NothingSchema,
      body: NothingSchema,
      async handler({ req }) {
        return sessionWithStep(deps, req);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/session',
      summary: 'Sign in with e-mail and password (with two-step sign-in on: only as far as the second step)',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      before: limits,
      body: SignInSchema,
      command: signIn,
      async handler({ req, body, run }) {
        const outcome = await run(signIn, body);
        if (!outcome.user) throw invalidCredentials();
        if (outcome.secondStep) {
          await beginSecondStep(req, outcome.user);
          return sessionWithStep(deps, req);
        }
        await startSession(req, outcome.user);
        return sessionDto(deps, req);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/session/second-step',
      summary: 'Finish signing in with a code from the authenticator app or a recovery code',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      before: limits,
      body: SecondStepSchema,
      command: finishSignIn,
      async handler({ req, body, run }) {
        const pending = pendingSecondStep(req);
        if (!pending) throw stepTimedOut();
        const user = await run(finishSignIn, { userId: pending.userId, email: pending.email, code: body.code });
        if (!user) throw wrongCode();
        // passport's login regenerates the session id: the pending marker goes with the old one.
        await startSession(req, user);
        return sessionDto(deps, req);
      },
    }),
    publicRoute({
      method: 'delete',
      path: '/session',
      summary: 'Sign out: the session row is deleted',
      access: { kind: 'signedIn' },
      params: NothingSchema,
      query: NothingSchema,
      body: NothingSchema,
      command: signOut,
      async handler({ req, res, run }) {
        await run(signOut, undefined);
        await endSession(req, res);
        return undefined;
      },
    }),
    publicRoute({
      method: 'patch',
      path: '/me',
      summary: 'Change my display name or unit preference',
      access: { kind: 'signedIn' },
      params: NothingSchema,
      query: NothingSchema,
      body: ProfileUpdateSchema,
      command: updateProfile,
      async handler({ body, run }) {
        return run(updateProfile, body);
      },
    }),
  ];
}
