import { describe, expect, it, vi } from 'vitest';

describe('zod without its JIT (our CSP forbids eval)', () => {
  it('zod reads the setting made before it loads, and builds and checks an object schema without new Function', async () => {
    vi.resetModules();
    await import('./zod-jitless');
    const probe = vi.spyOn(globalThis, 'Function');
    const { z } = await import('zod');
    expect(z.config().jitless).toBe(true);
    const schema = z.object({ email: z.string().email(), password: z.string().min(1) });
    expect(schema.safeParse({ email: 'maya@example.org', password: 'x' }).success).toBe(true);
    expect(schema.safeParse({ email: 'maya', password: '' }).success).toBe(false);
    expect(probe).not.toHaveBeenCalled();
    probe.mockRestore();
  });
});
