/**
 * The error codes of the API, shared by both sides: the server maps each to an HTTP status in one
 * exhaustive switch; the client reads the code and shows the sentence that comes with it.
 */
export const ERROR_CODES = [
  'validation_failed',
  'unauthenticated',
  'invalid_credentials',
  'session_expired',
  'csrf_failed',
  'forbidden',
  'not_found',
  'conflict',
  'version_conflict',
  'invitation_invalid',
  'reset_invalid',
  /** An organization sign-up's confirmation link that cannot be used (one message for every reason). */
  'signup_invalid',
  'payload_too_large',
  'unsupported_media_type',
  'range_not_satisfiable',
  'unprocessable',
  'rate_limited',
  /** Sign-in refused for the caller's network (a shared address), not for their account. */
  'rate_limited_network',
  'unavailable',
  'internal',
] as const;

export type ErrorCode = (typeof ERROR_CODES)[number];

/** The HTTP status of each code (RFC 9110 section 15). */
export function statusFor(code: ErrorCode): number {
  switch (code) {
    case 'validation_failed':
      return 400;
    case 'unauthenticated':
    case 'invalid_credentials':
    case 'session_expired':
      return 401;
    case 'csrf_failed':
    case 'forbidden':
      return 403;
    case 'not_found':
    case 'invitation_invalid':
    case 'reset_invalid':
    case 'signup_invalid':
      return 404;
    case 'conflict':
    case 'version_conflict':
      return 409;
    case 'payload_too_large':
      return 413;
    case 'unsupported_media_type':
      return 415;
    case 'range_not_satisfiable':
      return 416;
    case 'unprocessable':
      return 422;
    case 'rate_limited':
    case 'rate_limited_network':
      return 429;
    case 'unavailable':
      return 503;
    case 'internal':
      return 500;
  }
}
