import bcrypt from 'bcryptjs';
import type { TwoStepEnabledDto, TwoStepSetupDto } from '../../../policies/dto';
import { TotpRecoveryCode, User, UserTotp } from '../entities';
import { publicCommand, type CommandCtx } from '../core/command';
import { AppError } from '../core/errors';
import {
  acceptedStep,
  decryptSecret,
  encryptSecret,
  lockTotp,
  newAuthenticatorSecret,
  newRecoveryCodes,
  normaliseCode,
  recoveryCodeHash,
  twoStepKey,
} from '../services/two-step';
import { accountHolder, auditAccount, useAuditedSecondStepCode } from './account';

/**
 * Two-step sign-in (TOTP, RFC 6238) on the signed-in person's own account (ASVS 5.0 V6.3.3). Turning
 * it off or replacing the recovery codes needs the password and a current code again, not just the
 * session.
 */

const fieldError = (field: string, message: string) =>
  new AppError('validation_failed', `Please check the form: ${field} ${message}.`, { [field]: [message] });

/** Any old recovery codes go and a new set is stored (hashed) and audited; the codes are answered this once. */
async function storeNewRecoveryCodes(ctx: CommandCtx, userId: string, action: string): Promise<TwoStepEnabledDto> {
  const key = twoStepKey(ctx.deps.config);
  await ctx.m.delete(TotpRecoveryCode, { userId });
  const recoveryCodes = newRecoveryCodes();
  await ctx.m.insert(
    TotpRecoveryCode,
    recoveryCodes.map((c) => ({ userId, codeHash: recoveryCodeHash(key, normaliseCode(c)), usedAt: null })),
  );
  await auditAccount(ctx, { action, userId, after: { recoveryCodes: recoveryCodes.length } });
  return { recoveryCodes };
}

/**
 * The password again, then a current code (or an unused recovery code, used up and audited).
 * `outcome` ends the refusals' sentences ("That password is not right, so two-step sign-in stays on.").
 */
async function passwordAndCode(ctx: CommandCtx, input: { password: string; code: string }, outcome: string): Promise<string> {
  const userId = accountHolder(ctx);
  const me = await ctx.m.findOneByOrFail(User, { id: userId });
  if (!(await bcrypt.compare(input.password, me.passwordHash))) {
    throw new AppError('invalid_credentials', `That password is not right, ${outcome}.`, { password: ['is not your current password'] });
  }
  const row = await lockTotp(ctx.m, userId);
  if (!row?.enabledAt) throw new AppError('conflict', 'Two-step sign-in is not on.');
  if (!(await useAuditedSecondStepCode(ctx, userId, input.code))) {
    throw new AppError('invalid_credentials', `That code did not work, ${outcome}.`, {
      code: ['is not a current code or an unused recovery code'],
    });
  }
  return userId;
}

/** A new authenticator secret, stored encrypted and not in force until a current code confirms it. */
export const startTwoStepSetup = publicCommand({
  name: 'startTwoStepSetup',
  async run(ctx, _input: void): Promise<TwoStepSetupDto> {
    const userId = accountHolder(ctx);
    const me = await ctx.m.findOneByOrFail(User, { id: userId });
    const row = await lockTotp(ctx.m, userId);
    if (row?.enabledAt)
      throw new AppError('conflict', 'Two-step sign-in is already on. Turn it off first if you want to move it to another app.');
    const fresh = await newAuthenticatorSecret(me.email);
    const secretEnc = encryptSecret(twoStepKey(ctx.deps.config), userId, fresh.secret);
    if (row) await ctx.m.update(UserTotp, { userId }, { secretEnc, lastUsedStep: null });
    else await ctx.m.insert(UserTotp, { userId, secretEnc, enabledAt: null, lastUsedStep: null });
    return fresh;
  },
});

/** Turns it on with a current code from the app just set up; answers the recovery codes, once. */
export const enableTwoStep = publicCommand({
  name: 'enableTwoStep',
  async run(ctx, input: { code: string }): Promise<TwoStepEnabledDto> {
    const userId = accountHolder(ctx);
    const row = await lockTotp(ctx.m, userId);
    if (!row) throw new AppError('conflict', 'Start the set-up first: it gives you the code to scan.');
    if (row.enabledAt) throw new AppError('conflict', 'Two-step sign-in is already on.');
    const step = acceptedStep(decryptSecret(twoStepKey(ctx.deps.config), userId, row.secretEnc), input.code, row.lastUsedStep);
    if (step === null)
      throw fieldError(
        'code',
        'is not the code your app shows now; check that the app was set up with this page’s code, then try the newest code',
      );
    await ctx.m.update(UserTotp, { userId }, { enabledAt: new Date(), lastUsedStep: String(step) });
    return storeNewRecoveryCodes(ctx, userId, 'auth.two_step_enabled');
  },
});

export const disableTwoStep = publicCommand({
  name: 'disableTwoStep',
  async run(ctx, input: { password: string; code: string }): Promise<void> {
    const userId = await passwordAndCode(ctx, input, 'so two-step sign-in stays on');
    await ctx.m.delete(TotpRecoveryCode, { userId });
    await ctx.m.delete(UserTotp, { userId });
    await auditAccount(ctx, { action: 'auth.two_step_disabled', userId });
  },
});

export const replaceRecoveryCodes = publicCommand({
  name: 'replaceRecoveryCodes',
  async run(ctx, input: { password: string; code: string }): Promise<TwoStepEnabledDto> {
    const userId = await passwordAndCode(ctx, input, 'so your recovery codes stay as they were');
    return storeNewRecoveryCodes(ctx, userId, 'auth.recovery_codes_replaced');
  },
});
