import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import bcrypt from 'bcryptjs';
import type { EntityManager } from 'typeorm';
import type { TwoStepEnabledDto, TwoStepSetupDto, TwoStepStatusDto } from '../../../../policies/dto';
import {
  PasswordResetConfirmSchema,
  PasswordResetRequestSchema,
  TwoStepDisableSchema,
  TwoStepEnableSchema,
} from '../../../../policies/schemas';
import { TotpRecoveryCode, User, UserTotp } from '../../entities';
import type { Deps } from '../../http/context';
import { AppError } from '../../core/errors';
import { publicRoute, type RouteDef } from '../../http/route';
import { limitStore, signInLimits } from '../../http/security';
import { confirmPasswordReset, requestPasswordReset, RESET_REQUESTED } from '../../services/password-reset';
import { accountLimits, auditAccount, useAuditedSecondStepCode } from '../../services/sign-in';
import {
  acceptedStep,
  decryptSecret,
  encryptSecret,
  lockTotp,
  newAuthenticatorSecret,
  newRecoveryCodes,
  normaliseCode,
  recoveryCodeHash,
  recoveryCodesLeft,
  twoStepKey,
} from '../../services/two-step';

/**
 * Reset requests always answer 202, so they are counted whatever the outcome: per IP address and per
 * e-mail address typed (known or not, so the limit itself reveals nothing), over the sign-in window.
 */
function resetRequestLimits(deps: Deps): RequestHandler[] {
  const windowMs = deps.config.SIGNIN_WINDOW_SECONDS * 1000;
  const refused = new AppError('rate_limited', 'Too many password reset requests. Wait a few minutes and try again.');
  const common = {
    windowMs,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    handler: (_req: unknown, _res: unknown, next: (e: unknown) => void) => next(refused),
  };
  return [
    rateLimit({
      ...common,
      store: limitStore(deps, 'reset-ip'),
      limit: deps.config.RESET_MAX_PER_IP,
      keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    }),
    rateLimit({
      ...common,
      store: limitStore(deps, 'reset-account'),
      limit: deps.config.RESET_MAX_PER_ACCOUNT,
      keyGenerator: (req) => `reset:${typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : ''}`,
    }),
  ];
}

const fieldError = (field: string, message: string) =>
  new AppError('validation_failed', `Please check the form: ${field} ${message}.`, { [field]: [message] });

export function accountSecurityRoutes(deps: Deps): RouteDef[] {
  const limits = accountLimits(deps);

  /** Changes to two-step sign-in itself need the password again, not just the session. */
  async function assertPassword(ds: Deps['ds'], userId: string, password: string, outcome: string) {
    const fresh = await ds.getRepository(User).findOneByOrFail({ id: userId });
    if (!(await bcrypt.compare(password, fresh.passwordHash))) {
      throw new AppError('invalid_credentials', `That password is not right, ${outcome}.`, { password: ['is not your current password'] });
    }
  }

  /** ...and a current app code or an unused recovery code (which is then used up and audited). */
  async function useCodeOrRefuse(m: EntityManager, userId: string, code: string, requestId: string, outcome: string) {
    const row = await lockTotp(m, userId);
    if (!row?.enabledAt) throw new AppError('conflict', 'Two-step sign-in is not on.');
    const used = await useAuditedSecondStepCode(m, twoStepKey(deps.config), userId, code, requestId);
    if (!used)
      throw new AppError('invalid_credentials', `That code did not work, ${outcome}.`, {
        code: ['is not a current code or an unused recovery code'],
      });
  }

  /** Any old recovery codes go and a new set is stored (hashed) and audited; the codes are answered this once. */
  async function replaceRecoveryCodes(m: EntityManager, userId: string, requestId: string, action: string): Promise<TwoStepEnabledDto> {
    const key = twoStepKey(deps.config);
    await m.delete(TotpRecoveryCode, { userId });
    const recoveryCodes = newRecoveryCodes();
    await m.insert(
      TotpRecoveryCode,
      recoveryCodes.map((c) => ({ userId, codeHash: recoveryCodeHash(key, normaliseCode(c)), usedAt: null })),
    );
    await auditAccount(m, { requestId, action, userId, after: { recoveryCodes: recoveryCodes.length } });
    return { recoveryCodes };
  }

  /**
   * A change to two-step sign-in that is on, behind the account limiter: the password again, then in
   * one transaction a current code (or an unused recovery code), then the change. `outcome` ends the
   * refusals' sentences ("That password is not right, so two-step sign-in stays on.").
   */
  function passwordAndCodeRoute<T>(def: {
    path: string;
    summary: string;
    outcome: string;
    change: (m: EntityManager, userId: string, requestId: string) => Promise<T>;
  }): RouteDef {
    return publicRoute({
      method: 'post',
      path: def.path,
      summary: def.summary,
      access: { kind: 'signedIn' },
      before: limits,
      body: TwoStepDisableSchema,
      async handler({ ds, user, body, requestId }) {
        const me = user!;
        await assertPassword(ds, me.id, body.password, def.outcome);
        return ds.transaction(async (m) => {
          await useCodeOrRefuse(m, me.id, body.code, requestId, def.outcome);
          return def.change(m, me.id, requestId);
        });
      },
    });
  }

  return [
    publicRoute({
      method: 'post',
      path: '/password-reset',
      summary: 'Ask for a password reset link by e-mail (the same 202 whether or not the account exists)',
      access: { kind: 'public' },
      before: resetRequestLimits(deps),
      body: PasswordResetRequestSchema,
      status: 202,
      async handler({ req, body, requestId }) {
        const baseUrl = deps.config.PUBLIC_URL ?? `${req.protocol}://${req.get('host')}`;
        // Answered before any lookup, so the time taken says nothing about the address.
        void requestPasswordReset(deps, { email: body.email, baseUrl, requestId }).catch((err: unknown) =>
          deps.logger.error({ err, requestId }, 'password reset request failed'),
        );
        return RESET_REQUESTED;
      },
    }),
    publicRoute({
      method: 'post',
      path: '/password-reset/confirm',
      summary: 'Choose a new password with a reset link; ends the person’s other sessions',
      access: { kind: 'public' },
      before: signInLimits(deps),
      body: PasswordResetConfirmSchema,
      async handler({ req, body, requestId }) {
        await confirmPasswordReset(deps, { token: body.token, password: body.password, requestId, currentSid: req.sessionID ?? null });
        return undefined;
      },
    }),
    publicRoute({
      method: 'get',
      path: '/account/two-step',
      summary: 'Whether two-step sign-in is on for my account',
      access: { kind: 'signedIn' },
      async handler({ ds, user }) {
        const row = await ds.getRepository(UserTotp).findOne({ where: { userId: user!.id } });
        const dto: TwoStepStatusDto = {
          enabled: !!row?.enabledAt,
          enabledAt: row?.enabledAt?.toISOString() ?? null,
          recoveryCodesLeft: row?.enabledAt ? await recoveryCodesLeft(ds.manager, user!.id) : 0,
        };
        return dto;
      },
    }),
    publicRoute({
      method: 'post',
      path: '/account/two-step/setup',
      summary: 'Start setting up two-step sign-in: a new authenticator secret, not in force until confirmed',
      access: { kind: 'signedIn' },
      async handler({ ds, user }) {
        const me = user!;
        const fresh = await newAuthenticatorSecret(me.email);
        const key = twoStepKey(deps.config);
        await ds.transaction(async (m) => {
          const row = await lockTotp(m, me.id);
          if (row?.enabledAt)
            throw new AppError('conflict', 'Two-step sign-in is already on. Turn it off first if you want to move it to another app.');
          const secretEnc = encryptSecret(key, me.id, fresh.secret);
          if (row) await m.update(UserTotp, { userId: me.id }, { secretEnc, lastUsedStep: null });
          else await m.insert(UserTotp, { userId: me.id, secretEnc, enabledAt: null, lastUsedStep: null });
        });
        const dto: TwoStepSetupDto = fresh;
        return dto;
      },
    }),
    publicRoute({
      method: 'post',
      path: '/account/two-step/enable',
      summary: 'Turn two-step sign-in on with a current code; answers the recovery codes, once',
      access: { kind: 'signedIn' },
      body: TwoStepEnableSchema,
      async handler({ ds, user, body, requestId }) {
        const me = user!;
        const key = twoStepKey(deps.config);
        return ds.transaction(async (m) => {
          const row = await lockTotp(m, me.id);
          if (!row) throw new AppError('conflict', 'Start the set-up first: it gives you the code to scan.');
          if (row.enabledAt) throw new AppError('conflict', 'Two-step sign-in is already on.');
          const step = acceptedStep(decryptSecret(key, me.id, row.secretEnc), body.code, row.lastUsedStep);
          if (step === null)
            throw fieldError(
              'code',
              'is not the code your app shows now; check that the app was set up with this page’s code, then try the newest code',
            );
          await m.update(UserTotp, { userId: me.id }, { enabledAt: new Date(), lastUsedStep: String(step) });
          return replaceRecoveryCodes(m, me.id, requestId, 'auth.two_step_enabled');
        });
      },
    }),
    passwordAndCodeRoute({
      path: '/account/two-step/disable',
      summary: 'Turn two-step sign-in off: needs the password and a current code (or a recovery code)',
      outcome: 'so two-step sign-in stays on',
      async change(m, userId, requestId) {
        await m.delete(TotpRecoveryCode, { userId });
        await m.delete(UserTotp, { userId });
        await auditAccount(m, { requestId, action: 'auth.two_step_disabled', userId });
        return undefined;
      },
    }),
    passwordAndCodeRoute({
      path: '/account/two-step/recovery-codes',
      summary: 'Replace the recovery codes (password and a current code needed); answers the new ones, once',
      outcome: 'so your recovery codes stay as they were',
      change: (m, userId, requestId) => replaceRecoveryCodes(m, userId, requestId, 'auth.recovery_codes_replaced'),
    }),
  ];
}
