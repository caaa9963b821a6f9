import { describe, expect, it } from 'vitest';
import { QueryFailedError } from 'typeorm';
import { AppError } from '../core/errors';
import { normalise } from './error-mapping';

/** A node-postgres DatabaseError as it reaches us: an Error with the SQLSTATE in `code`. */
function pgError(code: string, message: string, extra: Record<string, unknown> = {}) {
  return Object.assign(new Error(message), { code, severity: 'ERROR', ...extra });
}
const wrapped = (err: Error) => new QueryFailedError('INSERT INTO t VALUES ($1)', ['secret value'], err);
const errno = (code: string, message = `connect ${code} 127.0.0.1:5432`) => Object.assign(new Error(message), { code, errno: -1 });

describe('normalise: any error → the AppError the client sees', () => {
  it('keeps an AppError as it is', () => {
    const e = new AppError('version_conflict', 'stale');
    expect(normalise(e)).toBe(e);
  });

  it('RFC 9110 section 15.5: a URIError from decoding a path parameter keeps its 400 and does not echo the value', () => {
    // What Express 5's router throws for /api/orgs/%ZZ/people (router/lib/layer.js decodeParam).
    const err = Object.assign(new URIError("Failed to decode param '%ZZ'"), { status: 400, statusCode: 400 });
    const out = normalise(err);
    expect(out.status).toBe(400);
    expect(out.code).toBe('validation_failed');
    expect(out.message).not.toContain('%ZZ');
  });

  it('RFC 9110 section 15.5: any error carrying a 4xx status keeps a 4xx (its own where a code exists, else 400)', () => {
    const cases: [number, number][] = [
      [400, 400],
      [401, 401],
      [403, 403],
      [404, 404],
      [409, 409],
      [413, 413],
      [415, 415],
      [416, 416],
      [422, 422],
      [429, 429],
      [405, 400],
      [408, 400],
      [411, 400],
    ];
    for (const [given, answered] of cases) {
      expect(normalise(Object.assign(new Error('x'), { status: given })).status, String(given)).toBe(answered);
      expect(normalise(Object.assign(new Error('x'), { statusCode: given })).status, String(given)).toBe(answered);
    }
    // A 5xx status is not the client's: it stays internal.
    expect(normalise(Object.assign(new Error('x'), { status: 502 })).code).toBe('internal');
  });

  it("ASVS 5.0 V16.5.1: body-parser's error types become 400, 413, 415 or 403 with a sentence of our own", () => {
    const bp = (type: string, status: number) => Object.assign(new Error(`raw ${type}`), { type, status, expose: true });
    expect(normalise(bp('entity.parse.failed', 400))).toMatchObject({ code: 'validation_failed', fields: { body: ['is not valid JSON'] } });
    expect(normalise(bp('entity.too.large', 413)).code).toBe('payload_too_large');
    expect(normalise(bp('parameters.too.many', 413)).code).toBe('payload_too_large');
    expect(normalise(bp('charset.unsupported', 415)).code).toBe('unsupported_media_type');
    expect(normalise(bp('encoding.unsupported', 415)).code).toBe('unsupported_media_type');
    expect(normalise(bp('request.aborted', 400)).code).toBe('validation_failed');
    expect(normalise(bp('request.size.invalid', 400)).code).toBe('validation_failed');
    expect(normalise(bp('entity.verify.failed', 403)).code).toBe('forbidden');
  });

  it('ASVS 5.0 V16.5.1: PostgreSQL class 22 (data exception) becomes 400 validation_failed without the value', () => {
    const samples = [
      pgError('22003', 'value "2147483648" is out of range for type integer'),
      pgError('22008', 'date/time field value out of range: "0000-01-01"'),
      pgError('22007', 'invalid input syntax for type date: "+010000-01-01"'),
      pgError('22021', 'invalid byte sequence for encoding "UTF8": 0x00'),
      pgError('22P05', 'unsupported Unicode escape sequence'),
      pgError('22P02', 'invalid input syntax for type uuid: "zz"'),
      pgError('22001', 'value too long for type character varying(80)'),
      pgError('54000', 'index row size 9000 exceeds btree version 4 maximum 2704'),
    ];
    for (const raw of samples) {
      for (const err of [raw, wrapped(raw)]) {
        const out = normalise(err);
        expect(out.status, raw.message).toBe(400);
        expect(out.code).toBe('validation_failed');
        expect(out.message).not.toMatch(/2147483648|0000-01-01|010000|0x00|zz|secret value|varying/);
      }
    }
  });

  it('ASVS 5.0 V16.5.1: PostgreSQL class 23 (integrity) becomes 409, 404 or 400 by its kind', () => {
    expect(normalise(wrapped(pgError('23505', 'duplicate key value violates unique constraint "x"'))).code).toBe('conflict');
    expect(normalise(wrapped(pgError('23P01', 'conflicting key value violates exclusion constraint'))).code).toBe('conflict');
    expect(
      normalise(
        wrapped(pgError('23503', 'insert violates foreign key', { detail: 'Key (athlete_id)=(…) is not present in table "memberships".' })),
      ).code,
    ).toBe('not_found');
    expect(
      normalise(
        wrapped(pgError('23503', 'delete violates foreign key', { detail: 'Key (id)=(…) is still referenced from table "cases".' })),
      ).code,
    ).toBe('conflict');
    expect(normalise(wrapped(pgError('23502', 'null value in column "name" violates not-null constraint'))).status).toBe(400);
    expect(normalise(wrapped(pgError('23514', 'new row violates check constraint "pain_0_10"'))).status).toBe(400);
  });

  it('RFC 9110 section 15.6.4: every kind of lost or refused database connection becomes 503 unavailable', () => {
    const samples: Error[] = [
      errno('ECONNREFUSED'),
      errno('ECONNRESET', 'read ECONNRESET'),
      errno('EPIPE', 'write EPIPE'),
      errno('ETIMEDOUT'),
      errno('EHOSTUNREACH'),
      pgError('08006', 'connection failure'),
      pgError('08003', 'connection does not exist'),
      pgError('57P01', 'terminating connection due to administrator command'),
      pgError('57P02', 'terminating connection due to crash of another server process'),
      pgError('57P03', 'the database system is starting up'),
      pgError('53300', 'sorry, too many clients already'),
      pgError('40001', 'could not serialize access due to concurrent update'),
      pgError('40P01', 'deadlock detected'),
      new Error('Connection terminated unexpectedly'),
      new Error('Connection terminated due to connection timeout'),
      new Error('timeout exceeded when trying to connect'),
      new Error('Client has encountered a connection error and is not queryable'),
    ];
    for (const raw of samples) {
      expect(normalise(raw).code, raw.message).toBe('unavailable');
      expect(normalise(wrapped(raw)).status, `wrapped: ${raw.message}`).toBe(503);
    }
  });

  it('anything else (a bug of ours, 42xxx) stays 500 internal with a fixed sentence', () => {
    for (const err of [
      new TypeError("Cannot read properties of undefined (reading 'id')"),
      wrapped(pgError('42703', 'column "x" does not exist')),
      null,
      'text',
    ]) {
      const out = normalise(err);
      expect(out.code).toBe('internal');
      expect(out.message).toBe('Something went wrong on our side. It has been logged; please try again.');
    }
  });
});
