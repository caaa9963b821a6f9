import pino, { type DestinationStream, type Logger } from 'pino';

/**
 * Logs hold no health data and no secrets (ASVS 5.0 V16.2.5). Two layers:
 * - `serializeErr` keeps only the shape of a database error: a failed write's TypeORM error carries
 *   the row's values in `parameters`, PostgreSQL's `detail` ("Failing row contains (…)") echoes them,
 *   and a message or stack line may quote them too ("invalid input syntax for type uuid: …").
 * - `LOG_REDACT` censors bodies, query parameters and credentials wherever else they might appear.
 */

/** Fields of a PostgreSQL error that name what failed without quoting any value. */
const DB_ERROR_KEEP = ['code', 'severity', 'constraint', 'table', 'schema', 'column', 'dataType', 'routine'] as const;

type ErrLike = Record<string, unknown> & { name?: unknown; type?: unknown; message?: unknown; stack?: unknown; cause?: unknown };

function isDatabaseError(e: ErrLike): boolean {
  const kind = String(e.type ?? e.name ?? (e.constructor as { name?: string } | undefined)?.name ?? '');
  if (kind === 'QueryFailedError' || kind === 'DatabaseError') return true;
  // Any other error that carries a query, its parameters or a SQLSTATE with a server routine.
  return 'parameters' in e || 'driverError' in e || (typeof e.code === 'string' && /^[0-9A-Z]{5}$/.test(e.code) && 'routine' in e);
}

/** The stack without its first line, which repeats the message (and so any value it quotes). */
function framesOnly(stack: unknown): string | undefined {
  if (typeof stack !== 'string') return undefined;
  const frames = stack.split('\n').filter((line) => /^\s+at /.test(line));
  return frames.length ? frames.join('\n') : undefined;
}

/** pino's `err` serializer: database errors reduced to their code and names; other errors as pino has them, minus values. */
export function serializeErr(value: unknown): unknown {
  if (!value || typeof value !== 'object') return value;
  // pino-http hands its serializer pino's own output, which keeps the original error as `raw`.
  const raw = (value as { raw?: unknown }).raw;
  const e = (raw instanceof Error ? raw : value) as ErrLike;
  if (isDatabaseError(e)) {
    const kept: Record<string, unknown> = { type: String(e.type ?? e.name ?? 'DatabaseError') };
    const driver = (e.driverError ?? {}) as Record<string, unknown>;
    for (const key of DB_ERROR_KEEP) {
      const v = e[key] ?? driver[key];
      if (v !== undefined && v !== null) kept[key] = v;
    }
    kept.message = `database error ${String(kept.code ?? 'without a code')}${kept.constraint ? ` (${String(kept.constraint)})` : ''}`;
    const frames = framesOnly(e.stack);
    if (frames) kept.stack = frames;
    return kept;
  }
  const out = (e instanceof Error ? pino.stdSerializers.err(e) : { ...e }) as Record<string, unknown>;
  for (const key of ['parameters', 'query', 'detail', 'driverError', 'body']) delete out[key];
  if (e.cause && typeof e.cause === 'object') {
    // pino folds the causes' messages and stacks into the outer ones; each cause is serialized on its own instead.
    if (e instanceof Error) {
      out.message = e.message;
      out.stack = e.stack;
    }
    out.cause = serializeErr(e.cause);
  }
  return out;
}

/** A database error logged as the first argument would otherwise become the line's message, values and all. */
function logMethod(this: Logger, args: unknown[], method: (...a: unknown[]) => void) {
  const [first, ...rest] = args;
  if (first instanceof Error && isDatabaseError(first as unknown as ErrLike)) {
    return method.apply(this, [{ err: first }, typeof rest[0] === 'string' ? rest[0] : 'database error', ...rest.slice(1)]);
  }
  return method.apply(this, args);
}

/** Paths pino censors in every log line: bodies, SQL and its parameters, cookies, tokens and passwords. */
export const LOG_REDACT = {
  paths: [
    'req.headers.cookie',
    'req.headers.authorization',
    'req.headers["x-csrf-token"]',
    'res.headers["set-cookie"]',
    'req.body',
    'res.body',
    'body',
    'parameters',
    'query',
    'detail',
    'err.parameters',
    'err.query',
    'err.detail',
    'err.driverError',
    'err.cause.parameters',
    'err.cause.detail',
    'password',
    'token',
    '*.password',
    '*.newPassword',
    '*.currentPassword',
    '*.token',
    '*.csrfToken',
    '*.secret',
  ],
  censor: '[redacted]',
};

export const LOG_SERIALIZERS = { err: serializeErr };

/**
 * The process's logger; `destination` lets a test capture what would be written. Otherwise lines go
 * to standard output asynchronously (a request's log line no longer waits for its write; pino flushes
 * what is pending when the process exits, process.exit included).
 */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  const options = {
    level,
    base: { app: 'loadline' },
    timestamp: pino.stdTimeFunctions.isoTime,
    serializers: LOG_SERIALIZERS,
    redact: LOG_REDACT,
    hooks: { logMethod },
  };
  return pino(options, destination ?? pino.destination({ dest: 1, sync: false }));
}
