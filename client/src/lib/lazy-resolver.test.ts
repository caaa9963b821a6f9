import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { lazyZodResolver } from './lazy-resolver';

const Schema = z.strictObject({ email: z.string().email('must be a valid e-mail address') });
const options = { fields: {}, shouldUseNativeValidation: false } as const;

describe('a shared schema’s form check fetched on first use', () => {
  it('fetches the schema only when the form is first checked or focused, and once', async () => {
    const load = vi.fn(async () => Schema);
    const check = lazyZodResolver(load);
    expect(load).not.toHaveBeenCalled();
    check.preload();
    const bad = await check.resolver({ email: 'maya' }, undefined, options);
    expect(bad.errors.email?.message).toBe('must be a valid e-mail address');
    const good = await check.resolver({ email: 'maya@example.org' }, undefined, options);
    expect(good).toEqual({ values: { email: 'maya@example.org' }, errors: {} });
    expect(load).toHaveBeenCalledTimes(1);
  });

  it('lets the form through to the server’s own check when the schema cannot be fetched, and tries again next time', async () => {
    const load = vi.fn<() => Promise<typeof Schema>>().mockRejectedValueOnce(new TypeError('Failed to fetch')).mockResolvedValue(Schema);
    const check = lazyZodResolver(load);
    expect(await check.resolver({ email: 'maya' }, undefined, options)).toEqual({ values: { email: 'maya' }, errors: {} });
    const again = await check.resolver({ email: 'maya' }, undefined, options);
    expect(again.errors.email?.message).toBe('must be a valid e-mail address');
    expect(load).toHaveBeenCalledTimes(2);
  });
});
