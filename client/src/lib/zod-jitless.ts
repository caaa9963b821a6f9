/**
 * Our CSP forbids eval. Zod 4 probes for it with `new Function('')` when the first object schema is
 * built; the throw is caught, but the browser still logs and reports a CSP violation on every page
 * load. Turning the JIT off skips the probe. Imported first in main.tsx, before any schema module.
 *
 * Zod keeps its settings on `globalThis.__zod_globalConfig` (zod/v4/core/core.js: every copy of zod
 * in a page shares them) and keeps what it finds there. Setting the flag there, rather than calling
 * `z.config`, keeps zod itself out of the first script: the sign-in page and the athlete's home load
 * it only with the screens whose forms need it (a fast first load on a slow phone). zod-jitless.test.ts
 * checks that zod reads it.
 */
const shared = globalThis as typeof globalThis & { __zod_globalConfig?: { jitless?: boolean } };
shared.__zod_globalConfig = { ...shared.__zod_globalConfig, jitless: true };
export {};
