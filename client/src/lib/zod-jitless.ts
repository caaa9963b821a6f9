import { z } from 'zod';

/**
 * Our CSP forbids eval. Zod 4 probes for it with `new Function('')` when the first object schema is
 * built; the throw is caught, but the browser still logs and reports a CSP violation on every page
 * load. Turning the JIT off skips the probe. Imported first in main.tsx, before any schema module.
 */
z.config({ jitless: true });
