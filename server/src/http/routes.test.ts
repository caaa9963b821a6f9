import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { Client, useHarness } from '../test/harness';
import { expectNoStack } from '../test/no-stack';
import { ROUTE_TABLE } from './route';

const WRITE_METHODS = new Set(['POST', 'PATCH', 'PUT', 'DELETE']);

/** Fills `:name` parameters from `ids`, or with a fresh, well-formed uuid. */
function fillPath(path: string, ids: Record<string, string> = {}): string {
  return path.replace(/:(\w+)/g, (_m, name: string) => ids[name] ?? randomUUID());
}

function send(agent: ReturnType<typeof request.agent> | ReturnType<typeof request>, method: string, path: string) {
  const m = method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
  return agent[m](path);
}

describe('the route table', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '10000', SIGNIN_MAX_FAILURES_PER_ACCOUNT: '10000' });

  it('is filled when the app is built', () => {
    expect(ROUTE_TABLE.length).toBeGreaterThan(10);
    expect(ROUTE_TABLE.every((r) => r.path.startsWith('/api/'))).toBe(true);
  });

  it('answers 401 unauthenticated to a signed-out caller on every route not on the public list', async () => {
    const anon = await Client.anonymous(h.app);
    const guarded = ROUTE_TABLE.filter((r) => r.access !== 'public');
    expect(guarded.length).toBeGreaterThan(10);
    const outcomes: string[] = [];
    for (const route of guarded) {
      let req = send(anon.agent, route.method, fillPath(route.path));
      // A valid token of the anonymous session, so CSRF is not what refuses the write.
      if (WRITE_METHODS.has(route.method)) req = req.set('x-csrf-token', anon.csrf).send({});
      const res = await req;
      outcomes.push(`${route.method} ${route.path} → ${res.status} ${res.body?.error?.code}`);
    }
    expect(outcomes).toEqual(guarded.map((r) => `${r.method} ${r.path} → 401 unauthenticated`));
  });

  it('is reviewed as data: any change of a route or its required access shows as a diff here', () => {
    const rows = ROUTE_TABLE.map((r) => `${r.method.padEnd(6)} ${r.path}  ⇒  ${r.access}`);
    expect(rows).toMatchInlineSnapshot(`
      [
        "GET    /api/health  ⇒  public",
        "GET    /api/session  ⇒  public",
        "POST   /api/session  ⇒  public",
        "POST   /api/session/second-step  ⇒  public",
        "DELETE /api/session  ⇒  signedIn",
        "PATCH  /api/me  ⇒  signedIn",
        "POST   /api/password-reset  ⇒  public",
        "POST   /api/password-reset/confirm  ⇒  public",
        "GET    /api/account/two-step  ⇒  signedIn",
        "POST   /api/account/two-step/setup  ⇒  signedIn",
        "POST   /api/account/two-step/enable  ⇒  signedIn",
        "POST   /api/account/two-step/disable  ⇒  signedIn",
        "POST   /api/account/two-step/recovery-codes  ⇒  signedIn",
        "POST   /api/invitations/preview  ⇒  public",
        "POST   /api/invitations/accept  ⇒  public",
        "GET    /api/orgs/:orgId/invitations  ⇒  member: read Invitation",
        "POST   /api/orgs/:orgId/invitations  ⇒  member: create Invitation",
        "DELETE /api/orgs/:orgId/invitations/:id  ⇒  member: delete Invitation",
        "GET    /api/org-signup  ⇒  public",
        "POST   /api/org-signup  ⇒  public",
        "POST   /api/org-signup/confirm  ⇒  public",
        "GET    /api/orgs/:orgId  ⇒  member: read Organization",
        "GET    /api/orgs/:orgId/settings  ⇒  member: update Organization",
        "PATCH  /api/orgs/:orgId/settings  ⇒  member: update Organization",
        "GET    /api/orgs/:orgId/people  ⇒  member: read Membership",
        "GET    /api/orgs/:orgId/people/:id  ⇒  member: read Membership",
        "PATCH  /api/orgs/:orgId/people/:id  ⇒  member: update Membership",
        "DELETE /api/orgs/:orgId/people/:id  ⇒  member: delete Membership",
        "GET    /api/orgs/:orgId/athletes  ⇒  member: read Athlete",
        "GET    /api/orgs/:orgId/athletes/:id  ⇒  member: read Athlete",
        "PATCH  /api/orgs/:orgId/athletes/:id  ⇒  member: update Athlete",
        "POST   /api/orgs/:orgId/care-team  ⇒  member: create CareTeamAssignment",
        "DELETE /api/orgs/:orgId/care-team/:id  ⇒  member: delete CareTeamAssignment",
        "POST   /api/orgs/:orgId/guardian-links  ⇒  member: create GuardianLink",
        "DELETE /api/orgs/:orgId/guardian-links/:id  ⇒  member: delete GuardianLink",
        "GET    /api/orgs/:orgId/audit  ⇒  member: read AuditEntry",
        "GET    /api/orgs/:orgId/audit/export  ⇒  member: read AuditEntry",
        "GET    /api/orgs/:orgId/audit/verify  ⇒  member: read AuditChain",
        "GET    /api/orgs/:orgId/caseload  ⇒  member: read Athlete",
        "GET    /api/orgs/:orgId/cases  ⇒  member: read Case",
        "POST   /api/orgs/:orgId/cases  ⇒  member: create Case",
        "GET    /api/orgs/:orgId/cases/:id  ⇒  member: read Case",
        "PATCH  /api/orgs/:orgId/cases/:id  ⇒  member: update Case",
        "POST   /api/orgs/:orgId/cases/:id/status  ⇒  member: create ParticipationStatus",
        "POST   /api/orgs/:orgId/cases/:id/close  ⇒  member: update Case",
        "POST   /api/orgs/:orgId/cases/:id/plan  ⇒  member: create RestrictionPlan",
        "GET    /api/orgs/:orgId/plans/:id  ⇒  member: read RestrictionPlan",
        "PUT    /api/orgs/:orgId/plans/:id  ⇒  member: update RestrictionPlan",
        "GET    /api/orgs/:orgId/plans/:id/versions  ⇒  member: read RestrictionPlan",
        "GET    /api/orgs/:orgId/plans/:id/versions/:version  ⇒  member: read RestrictionPlan",
        "GET    /api/orgs/:orgId/athletes/:id/in-force  ⇒  member: read RestrictionPlan",
        "GET    /api/orgs/:orgId/plan-templates  ⇒  member: read PlanTemplate",
        "POST   /api/orgs/:orgId/plan-templates  ⇒  member: create PlanTemplate",
        "POST   /api/orgs/:orgId/plan-templates/from-plan  ⇒  member: create PlanTemplate",
        "GET    /api/orgs/:orgId/plan-templates/:id  ⇒  member: read PlanTemplate",
        "PUT    /api/orgs/:orgId/plan-templates/:id  ⇒  member: update PlanTemplate",
        "POST   /api/orgs/:orgId/plan-templates/:id/copy  ⇒  member: create PlanTemplate",
        "POST   /api/orgs/:orgId/plan-templates/:id/archive  ⇒  member: update PlanTemplate",
        "GET    /api/orgs/:orgId/plans/:id/stage-criteria  ⇒  member: read RestrictionPlan",
        "POST   /api/orgs/:orgId/plans/:id/stage-assessments  ⇒  member: update RestrictionPlan",
        "POST   /api/orgs/:orgId/plans/:id/readiness  ⇒  member: create CheckIn",
        "POST   /api/orgs/:orgId/plans/:id/advance  ⇒  member: update RestrictionPlan",
        "POST   /api/orgs/:orgId/pain-reports  ⇒  member: create PainReport",
        "GET    /api/orgs/:orgId/pain-reports  ⇒  member: read PainReport",
        "GET    /api/orgs/:orgId/pain-reports/:id  ⇒  member: read PainReport",
        "POST   /api/orgs/:orgId/training-logs  ⇒  member: create TrainingLog",
        "GET    /api/orgs/:orgId/training-logs  ⇒  member: read TrainingLog",
        "POST   /api/orgs/:orgId/training-logs/:id/after  ⇒  member: update TrainingLog",
        "POST   /api/orgs/:orgId/training-logs/:id/next-morning  ⇒  member: update TrainingLog",
        "POST   /api/orgs/:orgId/check-ins  ⇒  member: create CheckIn",
        "GET    /api/orgs/:orgId/check-ins  ⇒  member: read CheckIn",
        "GET    /api/orgs/:orgId/athletes/:id/workload  ⇒  member: read TrainingLog",
        "GET    /api/orgs/:orgId/flags  ⇒  member: read Flag",
        "POST   /api/orgs/:orgId/flags/:id/acknowledge  ⇒  member: update Flag",
        "GET    /api/orgs/:orgId/notifications  ⇒  member: read Notification",
        "POST   /api/orgs/:orgId/notifications/:id/read  ⇒  member: update Notification",
        "POST   /api/orgs/:orgId/notifications/read-all  ⇒  member: update Notification",
        "GET    /api/orgs/:orgId/notice-preferences  ⇒  member: read Notification",
        "PATCH  /api/orgs/:orgId/notice-preferences  ⇒  member: update Notification",
        "GET    /api/orgs/:orgId/exercises  ⇒  member: read Exercise",
        "POST   /api/orgs/:orgId/exercises  ⇒  member: create Exercise",
        "PATCH  /api/orgs/:orgId/exercises/:id  ⇒  member: update Exercise",
        "GET    /api/orgs/:orgId/athletes/:id/baselines  ⇒  member: read Baseline",
        "POST   /api/orgs/:orgId/athletes/:id/baselines  ⇒  member: create Baseline",
        "GET    /api/orgs/:orgId/programs  ⇒  member: read Program",
        "POST   /api/orgs/:orgId/programs  ⇒  member: create Program",
        "GET    /api/orgs/:orgId/programs/:id  ⇒  member: read Program",
        "PATCH  /api/orgs/:orgId/programs/:id  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/programs/:id/sessions  ⇒  member: update Program",
        "PUT    /api/orgs/:orgId/sessions/:id  ⇒  member: update Program",
        "DELETE /api/orgs/:orgId/sessions/:id  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/sessions/:id/check  ⇒  member: read Program",
        "POST   /api/orgs/:orgId/sessions/:id/publish  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/sessions/:id/unpublish  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/programs/:id/copy-week  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/programs/:id/shift  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/sessions/:id/exceptions  ⇒  member: create ProgramException",
        "GET    /api/orgs/:orgId/exceptions  ⇒  member: read ProgramException",
        "POST   /api/orgs/:orgId/exceptions/:id/decide  ⇒  member: update ProgramException",
        "GET    /api/orgs/:orgId/team-programs  ⇒  member: read Program",
        "POST   /api/orgs/:orgId/team-programs  ⇒  member: create Program",
        "GET    /api/orgs/:orgId/team-programs/:id  ⇒  member: read Program",
        "PATCH  /api/orgs/:orgId/team-programs/:id  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/team-programs/:id/sessions  ⇒  member: update Program",
        "PATCH  /api/orgs/:orgId/team-sessions/:id  ⇒  member: update Program",
        "DELETE /api/orgs/:orgId/team-sessions/:id  ⇒  member: update Program",
        "GET    /api/orgs/:orgId/team-programs/:id/grid  ⇒  member: read Program",
        "POST   /api/orgs/:orgId/team-programs/:id/publish  ⇒  member: update Program",
        "GET    /api/orgs/:orgId/team-sessions/:id/versions/:athleteId  ⇒  member: read Program",
        "POST   /api/orgs/:orgId/team-sessions/:id/versions/:athleteId/accept  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/team-sessions/:id/versions/:athleteId/reset  ⇒  member: update Program",
        "POST   /api/orgs/:orgId/team-sessions/:id/versions/:athleteId/as-written  ⇒  member: update Program",
        "GET    /api/orgs/:orgId/team-sessions/:id/floor-sheet.pdf  ⇒  member: read Program",
        "GET    /api/orgs/:orgId/team-sessions/:id/floor-sheet.csv  ⇒  member: read Program",
        "GET    /api/orgs/:orgId/groups  ⇒  member: read Group",
        "POST   /api/orgs/:orgId/groups  ⇒  member: create Group",
        "GET    /api/orgs/:orgId/groups/:id  ⇒  member: read Group",
        "PATCH  /api/orgs/:orgId/groups/:id  ⇒  member: update Group",
        "PUT    /api/orgs/:orgId/groups/:id/members  ⇒  member: update Group",
        "POST   /api/orgs/:orgId/groups/:id/archive  ⇒  member: update Group",
        "GET    /api/orgs/:orgId/injury-report  ⇒  member: read InjuryReport",
        "GET    /api/orgs/:orgId/injury-report.csv  ⇒  member: read InjuryReport",
        "GET    /api/orgs/:orgId/groups/:id/session-hours  ⇒  member: read Group",
        "POST   /api/orgs/:orgId/groups/:id/session-hours  ⇒  member: update Group",
        "GET    /api/orgs/:orgId/roster  ⇒  member: read Athlete",
        "GET    /api/orgs/:orgId/athletes/:id/today  ⇒  member: read Program",
        "GET    /api/orgs/:orgId/athletes/:id/week  ⇒  member: read Program",
        "GET    /api/orgs/:orgId/roster-imports/template.csv  ⇒  member: create Invitation",
        "POST   /api/orgs/:orgId/roster-imports  ⇒  member: create Invitation",
        "GET    /api/orgs/:orgId/roster-imports/last-check  ⇒  member: create Invitation",
        "GET    /api/orgs/:orgId/roster-imports/:id  ⇒  member: create Invitation",
        "POST   /api/orgs/:orgId/roster-imports/:id/start  ⇒  member: create Invitation",
        "GET    /api/orgs/:orgId/letters  ⇒  member: read Letter",
        "GET    /api/orgs/:orgId/letters/prefill  ⇒  member: create Letter",
        "POST   /api/orgs/:orgId/letters  ⇒  member: create Letter",
        "PATCH  /api/orgs/:orgId/letters/:id  ⇒  member: update Letter",
        "GET    /api/orgs/:orgId/letters/:id/preview  ⇒  member: update Letter",
        "POST   /api/orgs/:orgId/letters/:id/sign  ⇒  member: update Letter",
        "GET    /api/orgs/:orgId/letters/:id/pdf  ⇒  member: read Letter",
        "POST   /api/orgs/:orgId/letters/:id/acknowledge  ⇒  member: create LetterAcknowledgement",
        "POST   /api/check  ⇒  public",
        "GET    /api/orgs/:orgId/outbox  ⇒  member: read Outbox",
        "GET    /api/orgs/:orgId/deliveries  ⇒  member: read Outbox",
        "GET    /api/orgs/:orgId/cases/:id/documents  ⇒  member: read Case",
        "POST   /api/orgs/:orgId/cases/:id/documents  ⇒  member: read Case",
        "GET    /api/orgs/:orgId/documents/:id/file  ⇒  member: read Case",
        "DELETE /api/orgs/:orgId/documents/:id  ⇒  member: read Case",
        "GET    /api/orgs/:orgId/clips  ⇒  member: read Clip",
        "POST   /api/orgs/:orgId/clips  ⇒  member: create Clip",
        "GET    /api/orgs/:orgId/clips/:id  ⇒  member: read Clip",
        "GET    /api/orgs/:orgId/clips/:id/video  ⇒  member: read Clip",
        "DELETE /api/orgs/:orgId/clips/:id  ⇒  member: read Clip",
        "POST   /api/orgs/:orgId/clips/:id/notes  ⇒  member: create ClipNote",
        "DELETE /api/orgs/:orgId/clips/:id/notes/:noteId  ⇒  member: read ClipNote",
        "GET    /api/orgs/:orgId/record-exports  ⇒  member: read RecordExport",
        "POST   /api/orgs/:orgId/record-exports  ⇒  member: create RecordExport",
        "POST   /api/orgs/:orgId/record-exports/link  ⇒  member: read RecordExport",
        "POST   /api/orgs/:orgId/record-exports/download  ⇒  member: read RecordExport",
        "GET    /api/orgs/:orgId/calendar-feed  ⇒  member: read CalendarFeed",
        "POST   /api/orgs/:orgId/calendar-feed  ⇒  member: create CalendarFeed",
        "DELETE /api/orgs/:orgId/calendar-feed  ⇒  member: delete CalendarFeed",
        "GET    /api/calendar/:token.ics  ⇒  public",
        "GET    /api/orgs/:orgId/cases/:id/fhir  ⇒  member: read CaseExport",
      ]
    `);
  });

  it('answers an unknown API route with a JSON 404 not_found', async () => {
    const res = await request(h.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(res.body.error.code).toBe('not_found');
    expect(res.body.requestId).toBe(res.headers['x-request-id']);
    const anon = await Client.anonymous(h.app);
    const write = await anon.post('/api/orgs', {});
    expect(write.status).toBe(404);
    expect(write.body.error.code).toBe('not_found');
  });

  it('reports unknown body keys named like Object.prototype members as fields, never a 500', async () => {
    const anon = await Client.anonymous(h.app);
    const res = await anon.agent
      .post('/api/session')
      .set('x-csrf-token', anon.csrf)
      .set('Content-Type', 'application/json')
      .send('{"email":"a@test.example","password":"x","constructor":[],"toString":1,"__proto__":{"admin":true}}');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['__proto__', 'constructor', 'toString']);
    expect(res.body.error.message).toContain('constructor');
  });

  it('answers a malformed JSON body with 400 validation_failed naming body, and no stack trace', async () => {
    const res = await request(h.app).post('/api/session').set('Content-Type', 'application/json').send('{"email": "a@b.example", ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.fields).toHaveProperty('body');
    expect(Object.keys(res.body).sort()).toEqual(['error', 'requestId']);
    expect(res.body.error).not.toHaveProperty('stack');
    expectNoStack(res.text);
  });

  it('answers a body over 100 kB with 413', async () => {
    const big = JSON.stringify({ email: 'a@test.example', password: 'x'.repeat(110 * 1024) });
    const res = await request(h.app).post('/api/session').set('Content-Type', 'application/json').send(big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
    expectNoStack(res.text);
  });

  it('sends the security headers: tight CSP, nosniff, no referrer, no-store on the API, request id', async () => {
    for (const path of ['/api/health', '/api/session', '/api/no-such-thing']) {
      const res = await request(h.app).get(path);
      const csp = String(res.headers['content-security-policy']);
      for (const directive of ["script-src 'self'", "object-src 'none'", "frame-ancestors 'none'", "base-uri 'none'"]) {
        expect(csp, path).toContain(directive);
      }
      expect(csp).not.toContain('unsafe-inline');
      expect(csp).not.toContain('unsafe-eval');
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['referrer-policy']).toBe('no-referrer');
      expect(res.headers['cache-control'], path).toBe('no-store');
      expect(res.headers['x-request-id']).toMatch(/^[\w-]{8,64}$/);
      expect(res.headers['x-powered-by']).toBeUndefined();
    }
  });

  it('uses the request id in both the header and the error body; a well-formed incoming id is kept, a bad one replaced', async () => {
    const err = await request(h.app).get('/api/no-such-thing');
    expect(err.body.requestId).toBe(err.headers['x-request-id']);

    const kept = await request(h.app).get('/api/no-such-thing').set('X-Request-Id', 'trace-1234abcd');
    expect(kept.headers['x-request-id']).toBe('trace-1234abcd');
    expect(kept.body.requestId).toBe('trace-1234abcd');

    const replaced = await request(h.app).get('/api/no-such-thing').set('X-Request-Id', 'bad id with spaces <script>');
    expect(replaced.headers['x-request-id']).not.toContain(' ');
    expect(replaced.body.requestId).toBe(replaced.headers['x-request-id']);
  });
});
