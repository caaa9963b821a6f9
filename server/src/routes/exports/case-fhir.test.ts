import { createHash, randomUUID } from 'node:crypto';
import { Fhir } from 'fhir';
import { describe, expect, it } from 'vitest';
import { PainReport } from '../../entities';
import { caseBundle, painScore, type FhirCaseInput } from '../../services/fhir-case-bundle';
import { useHarness } from '../../test/harness';
import { addDays, pinClock, programWorld, TODAY } from '../../test/worlds/test-world';

/**
 * The HL7 FHIR R4 export of a case, validated with FHIR.js (`fhir` 4.12, R4 definitions)
 * and these rules of FHIR R4 and LOINC: pain as LOINC 72514-3 [confirmed] with valueInteger
 * 0–10 (11 refused); Condition invariant con-4 [confirmed]; restrictions as CarePlan.activity.detail
 * with doNotPerform and scheduledPeriod [secondary]; a date-only end is inclusive.
 */

type Resource = { resourceType: string; id: string; [k: string]: unknown };
type Bundle = { resourceType: 'Bundle'; type: string; entry: { fullUrl: string; resource: Resource }[] };

const fhir = new Fhir();
const errorsOf = (resource: object) => fhir.validate(resource).messages.filter((m) => m.severity === 'error');
const of = (b: Bundle, type: string) => b.entry.map((e) => e.resource).filter((r) => r.resourceType === type) as Record<string, any>[];

/** Every `{ reference }` anywhere in the Bundle names an entry of it (a collection carries what it points to). */
function references(value: unknown, out: string[] = []): string[] {
  if (Array.isArray(value)) value.forEach((v) => references(v, out));
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      if (k === 'reference' && typeof v === 'string') out.push(v);
      else references(v, out);
    }
  }
  return out;
}

/** con-4: a Condition with an abatement is inactive, resolved or in remission. */
function con4Holds(c: Record<string, any>): boolean {
  const abated = Object.keys(c).some((k) => k.startsWith('abatement'));
  return !abated || ['inactive', 'resolved', 'remission'].includes(c.clinicalStatus?.coding?.[0]?.code);
}

describe('the FHIR R4 export of a case', () => {
  const h = useHarness();
  pinClock();

  async function world() {
    const w = await programWorld(h);
    const c = await w.clinician.post(`${w.base}/cases`, {
      athleteId: w.athlete,
      bodyRegions: ['lower_back', 'hip_groin_left'],
      onsetDate: addDays(TODAY, -30),
      status: 'limited',
      statusEffectiveFrom: addDays(TODAY, -30),
      diagnosis: 'Lumbar strain',
      clinicalNotes: 'Not for the export',
    });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    const stages = [
      {
        id: randomUUID(),
        label: 'Settle',
        startDate: addDays(TODAY, -30),
        endDate: addDays(TODAY, -1),
        painCeiling: 3,
        patterns: { hinge: { mode: 'blocked' }, jump: { mode: 'blocked' } },
      },
      {
        id: randomUUID(),
        label: 'Build',
        startDate: TODAY,
        endDate: addDays(TODAY, 30),
        painCeiling: 4,
        patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } },
      },
    ];
    const plan = await w.clinician.post(`${w.base}/cases/${c.body.id}/plan`, { stages, guidance: '' });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);
    for (const painNow of [7, 4, 0]) {
      await h.ds.getRepository(PainReport).save({
        organizationId: w.org.id,
        athleteId: w.athlete,
        reportedBy: w.org.athlete.userId,
        bodyRegions: ['lower_back'],
        painNow,
        painWorst24h: painNow,
        onsetDate: addDays(TODAY, -30),
        aggravatingPatterns: [],
        startedInTraining: true,
        note: 'A narrative that stays in the app',
        redFlags: {},
        route: 'routine',
        caseId: c.body.id,
      });
    }
    const draft = await w.clinician.post(`${w.base}/letters`, {
      athleteId: w.athlete,
      decision: 'full',
      effectiveFrom: TODAY,
      validUntil: addDays(TODAY, 60),
      credential: 'ATC',
      licenceNumber: 'AT-12345',
      familyNote: 'Build up over the first week.',
    });
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    const signed = await w.clinician.post(`${w.base}/letters/${draft.body.id}/sign`, {
      signature: w.org.clinician.name,
      version: draft.body.version,
    });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    return {
      ...w,
      caseId: c.body.id as string,
      caseVersion: c.body.version as number,
      stages,
      letter: signed.body as { id: string; pdfSha256: string },
    };
  }

  const download = (client: { get: (p: string) => any }, base: string, caseId: string) => client.get(`${base}/cases/${caseId}/fhir`);

  it('gives the clinician a Bundle that FHIR R4 validates, with patient, condition, pain reports, care plan, clinician and letter', async () => {
    const w = await world();
    const res = await download(w.clinician, w.base, w.caseId);
    expect(res.status, res.text).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/fhir\+json/);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="case-${addDays(TODAY, -30)}.fhir.json"`);
    expect(res.headers['cache-control']).toBe('no-store');
    const bundle = JSON.parse(res.text) as Bundle;

    expect(bundle).toMatchObject({ resourceType: 'Bundle', type: 'collection' });
    expect(errorsOf(bundle)).toEqual([]);
    expect(fhir.validate(bundle).valid).toBe(true);
    // bdl-7: fullUrls are unique; every reference resolves inside the Bundle.
    const urls = bundle.entry.map((e) => e.fullUrl);
    expect(new Set(urls).size).toBe(urls.length);
    for (const r of references(bundle)) expect(urls).toContain(r);

    const [patient] = of(bundle, 'Patient');
    expect(patient).toMatchObject({ id: w.athlete, name: [{ text: w.org.athlete.name }], birthDate: '2010-03-14' });
    const [condition] = of(bundle, 'Condition');
    expect(condition).toMatchObject({
      code: { text: 'Lumbar strain' },
      bodySite: [{ text: 'Lower back' }, { text: 'Left hip / groin' }],
      onsetDateTime: addDays(TODAY, -30),
      clinicalStatus: { coding: [{ code: 'active' }] },
    });
    expect(con4Holds(condition)).toBe(true);

    const observations = of(bundle, 'Observation');
    expect(observations.map((o) => o.valueInteger)).toEqual([7, 4, 0]);
    for (const o of observations) {
      expect(o.code.coding).toEqual([
        { system: 'http://loinc.org', code: '72514-3', display: 'Pain severity - 0-10 verbal numeric rating [Score] - Reported' },
      ]);
      expect(o.status).toBe('final');
    }

    const [plan] = of(bundle, 'CarePlan');
    expect(plan).toMatchObject({ status: 'active', intent: 'plan', period: { start: addDays(TODAY, -30), end: addDays(TODAY, 30) } });
    const activities = plan.activity.map((a: { detail: Record<string, any> }) => a.detail);
    // Stages as activities with their periods (date-only ends, inclusive), past ones completed.
    expect(
      activities.filter((d: { doNotPerform?: boolean }) => !d.doNotPerform).map((d: any) => [d.code.text, d.status, d.scheduledPeriod]),
    ).toEqual([
      ['Stage 1 of 2: Settle', 'completed', { start: w.stages[0].startDate, end: w.stages[0].endDate }],
      ['Stage 2 of 2: Build', 'in-progress', { start: TODAY, end: addDays(TODAY, 30) }],
    ]);
    // Blocked movements as doNotPerform, each over its stage.
    expect(
      activities.filter((d: { doNotPerform?: boolean }) => d.doNotPerform).map((d: any) => [d.code.text, d.scheduledPeriod.end]),
    ).toEqual([
      ['Hinge', w.stages[0].endDate],
      ['Jump / landing', w.stages[0].endDate],
    ]);
    expect(activities.find((d: any) => d.code.text === 'Stage 2 of 2: Build').description).toContain('Hinge: up to 60% of estimated 1RM');

    const practitioners = of(bundle, 'Practitioner');
    expect(practitioners).toHaveLength(1);
    expect(practitioners[0]).toMatchObject({
      id: w.org.clinician.userId,
      qualification: [{ code: { text: 'ATC' }, identifier: [{ value: 'AT-12345' }] }],
    });

    const [doc] = of(bundle, 'DocumentReference');
    const attachment = doc.content[0].attachment;
    const pdf = Buffer.from(attachment.data, 'base64');
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(createHash('sha256').update(pdf).digest('hex')).toBe(w.letter.pdfSha256);
    expect(attachment).toMatchObject({
      contentType: 'application/pdf',
      size: pdf.length,
      hash: createHash('sha1').update(pdf).digest('base64'),
    });
    expect(doc).toMatchObject({ id: w.letter.id, status: 'current', docStatus: 'final' });

    // Clinical notes and pain narratives stay in the app.
    expect(res.text).not.toContain('Not for the export');
    expect(res.text).not.toContain('A narrative that stays in the app');

    const trail = await h.ds.query(
      `SELECT action, athlete_id, after FROM audit_entries WHERE subject_id = $1 AND action = 'case.exported_fhir'`,
      [w.caseId],
    );
    expect(trail).toEqual([{ action: 'case.exported_fhir', athlete_id: w.athlete, after: { painReports: 3, letters: 1, plan: 1 } }]);
  });

  it('a closed case is resolved with its abatement date (con-4), and the plan is completed', async () => {
    const w = await world();
    const close = await w.clinician.post(`${w.base}/cases/${w.caseId}/close`, { closedOn: TODAY, version: w.caseVersion });
    expect(close.status, JSON.stringify(close.body)).toBe(200);
    const bundle = JSON.parse((await download(w.clinician, w.base, w.caseId)).text) as Bundle;
    expect(errorsOf(bundle)).toEqual([]);
    const [condition] = of(bundle, 'Condition');
    expect(condition).toMatchObject({ abatementDateTime: TODAY, clinicalStatus: { coding: [{ code: 'resolved' }] } });
    expect(con4Holds(condition)).toBe(true);
    expect(of(bundle, 'CarePlan')[0].status).toBe('completed');
  });

  it('only a clinician on the care team downloads it: others 403 or 404', async () => {
    const w = await world();
    expect((await download(w.coach, w.base, w.caseId)).status).toBe(403);
    expect((await download(await w.as(w.org.athlete), w.base, w.caseId)).status).toBe(403);
    expect((await download(await w.as(w.org.admin), w.base, w.caseId)).status).toBe(403);
    expect((await download(await w.as(w.org.otherClinician), w.base, w.caseId)).status).toBe(404);
    const stranger = await programWorld(h);
    expect((await download(stranger.clinician, w.base, w.caseId)).status).toBe(404);
    expect((await download(w.clinician, w.base, randomUUID())).status).toBe(404);
  });
});

describe('the Bundle builder, alone', () => {
  const input: FhirCaseInput = {
    now: new Date('2026-12-03T12:00:00Z'),
    today: '2026-12-03',
    unit: 'kg',
    organization: { id: randomUUID(), name: 'Test' },
    athlete: { membershipId: randomUUID(), name: 'A. Athlete', dateOfBirth: null },
    kase: {
      id: randomUUID(),
      bodyRegions: ['knee_left'],
      onsetDate: '2026-11-01',
      diagnosis: null,
      openedAt: new Date('2026-11-02T09:00:00Z'),
      closedOn: null,
      openedBy: null,
    },
    practitioners: [],
    painReports: [{ id: randomUUID(), reportedAt: new Date('2026-11-02T09:00:00Z'), painNow: 10, bodyRegions: ['knee_left'] }],
    plan: null,
    letters: [],
  };

  it('refuses a pain score outside 0–10 (LOINC 72514-3, a 0–10 rating: 11 is rejected) rather than send it', () => {
    expect(painScore(0)).toBe(0);
    expect(painScore(10)).toBe(10);
    expect(() => painScore(11)).toThrow(RangeError);
    expect(() => painScore(-1)).toThrow(RangeError);
    expect(() => caseBundle({ ...input, painReports: [{ ...input.painReports[0], painNow: 11 }] })).toThrow(RangeError);
  });

  it('is valid with the least a case has, and the validator is live: a string valueInteger is an error', () => {
    const bundle = caseBundle(input) as unknown as Bundle;
    expect(errorsOf(bundle)).toEqual([]);
    expect(of(bundle, 'Condition')[0].code).toEqual({ text: 'Injury or pain: Left knee' });
    const broken = structuredClone(bundle);
    of(broken, 'Observation')[0].valueInteger = '3';
    expect(errorsOf(broken).map((m) => m.location)).toContain('Observation.valueInteger');
  });
});
