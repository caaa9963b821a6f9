import { createHash } from 'node:crypto';
import { BODY_REGION_LABELS, type BodyRegion } from '../../../policies/body-regions';
import { describeRule } from '../../../policies/load/describe';
import type { PlanStage } from '../../../policies/load/in-force';
import { MOVEMENT_PATTERNS, PATTERN_LABELS } from '../../../policies/load/patterns';
import type { Unit } from '../../../policies/schemas/common';

/**
 * A case as an HL7 FHIR R4 Bundle for the clinician's health record. Pure: the command loads
 * the rows, this lays them out. The resources are kept minimal (what the record needs to place the
 * case, nothing the clinician did not write); the rules of FHIR R4 and LOINC followed:
 * - pain reports: Observation, LOINC 72514-3 "Pain severity - 0-10 verbal numeric rating [Score] -
 *   Reported", valueInteger 0–10 (anything else is refused here, never sent);
 * - the injury: Condition; with an abatement date, clinicalStatus is resolved (invariant con-4);
 * - restrictions: R4 has no resource of their own, so CarePlan.activity.detail with scheduledPeriod,
 *   one activity per stage, and a doNotPerform activity per blocked movement; a stage's date-only end
 *   is inclusive, as FHIR reads a date-only Period.end;
 * - the letter: DocumentReference with the signed PDF as an attachment (with its SHA-1, as FHIR's
 *   Attachment.hash is defined).
 * Body regions and diagnoses go as text only: a code from memory would be worse than none.
 * @types/fhir here (3.0.2) has no R4 types, so the shapes below are written out for what is emitted;
 * the tests validate every Bundle with FHIR.js's R4 definitions.
 */

export const PAIN_LOINC = {
  system: 'http://loinc.org',
  code: '72514-3',
  display: 'Pain severity - 0-10 verbal numeric rating [Score] - Reported',
};
const CONDITION_CLINICAL = 'http://terminology.hl7.org/CodeSystem/condition-clinical';
const OBSERVATION_CATEGORY = 'http://terminology.hl7.org/CodeSystem/observation-category';
const CONDITION_CATEGORY = 'http://terminology.hl7.org/CodeSystem/condition-category';

export interface FhirCaseInput {
  /** The moment of the export (Bundle.timestamp) and the organization's today (activity status). */
  now: Date;
  today: string;
  unit: Unit;
  organization: { id: string; name: string };
  athlete: { membershipId: string; name: string; dateOfBirth: string | null };
  kase: {
    id: string;
    bodyRegions: BodyRegion[];
    onsetDate: string;
    diagnosis: string | null;
    openedAt: Date;
    closedOn: string | null;
    openedBy: string | null;
  };
  /** Everyone the Bundle names as author, by user id. */
  practitioners: { userId: string; name: string; credential?: string | null; licenceNumber?: string | null }[];
  painReports: { id: string; reportedAt: Date; painNow: number; bodyRegions: BodyRegion[] }[];
  plan: { id: string; version: number; stages: PlanStage[]; createdBy: string | null; createdAt: Date } | null;
  letters: {
    id: string;
    status: 'signed' | 'superseded';
    signedAt: Date;
    effectiveFrom: string;
    createdBy: string | null;
    decision: 'full' | 'limited';
    pdf: Buffer;
  }[];
}

type Json = Record<string, unknown>;
const ref = (id: string) => ({ reference: `urn:uuid:${id}` });
const text = (t: string) => ({ text: t });
const regionsText = (regions: BodyRegion[]) => regions.map((r) => BODY_REGION_LABELS[r]).join(', ');

function activityStatus(start: string, end: string, today: string): string {
  if (end < today) return 'completed';
  if (start > today) return 'not-started';
  return 'in-progress';
}

/** A pain score as FHIR allows it: a whole number 0–10 (LOINC 72514-3, a 0–10 rating: 11 is refused). */
export function painScore(n: number): number {
  if (!Number.isInteger(n) || n < 0 || n > 10) throw new RangeError(`a pain score is a whole number from 0 to 10, not ${n}`);
  return n;
}

function practitioner(p: FhirCaseInput['practitioners'][number]): Json {
  return {
    resourceType: 'Practitioner',
    id: p.userId,
    name: [{ text: p.name }],
    ...(p.credential
      ? { qualification: [{ code: text(p.credential), ...(p.licenceNumber ? { identifier: [{ value: p.licenceNumber }] } : {}) }] }
      : {}),
  };
}

function carePlan(input: FhirCaseInput, plan: NonNullable<FhirCaseInput['plan']>): Json {
  const stages = [...plan.stages].sort((a, b) => a.startDate.localeCompare(b.startDate));
  const activity: Json[] = [];
  stages.forEach((stage, i) => {
    const period = { start: stage.startDate, end: stage.endDate };
    const status = activityStatus(stage.startDate, stage.endDate, input.today);
    const limits = MOVEMENT_PATTERNS.filter((p) => stage.patterns[p] && stage.patterns[p]!.mode !== 'free').map((p) =>
      describeRule(p, stage.patterns[p]!, input.unit, 'staff'),
    );
    activity.push({
      detail: {
        status,
        code: text(`Stage ${i + 1} of ${stages.length}${stage.label ? `: ${stage.label}` : ''}`),
        scheduledPeriod: period,
        description: [...limits, `Pain ceiling during training: ${stage.painCeiling}/10`].join('; '),
      },
    });
    for (const p of MOVEMENT_PATTERNS) {
      if (stage.patterns[p]?.mode !== 'blocked') continue;
      activity.push({
        detail: {
          status,
          doNotPerform: true,
          code: text(PATTERN_LABELS[p]),
          scheduledPeriod: period,
          description: `${PATTERN_LABELS[p]}: not allowed in this stage`,
        },
      });
    }
  });
  const first = stages[0]?.startDate;
  const last = stages.at(-1)?.endDate;
  const done = input.kase.closedOn !== null || (last !== undefined && last < input.today);
  return {
    resourceType: 'CarePlan',
    id: plan.id,
    status: done ? 'completed' : 'active',
    intent: 'plan',
    title: `Restriction plan, version ${plan.version}`,
    subject: ref(input.athlete.membershipId),
    ...(first && last ? { period: { start: first, end: last } } : {}),
    created: plan.createdAt.toISOString(),
    ...(plan.createdBy ? { author: ref(plan.createdBy) } : {}),
    addresses: [ref(input.kase.id)],
    activity,
  };
}

export function caseBundle(input: FhirCaseInput): Json {
  const { kase, athlete } = input;
  const patient: Json = {
    resourceType: 'Patient',
    id: athlete.membershipId,
    identifier: [{ system: `urn:loadline:organization:${input.organization.id}:member`, value: athlete.membershipId }],
    name: [{ text: athlete.name }],
    ...(athlete.dateOfBirth ? { birthDate: athlete.dateOfBirth } : {}),
  };
  const condition: Json = {
    resourceType: 'Condition',
    id: kase.id,
    // con-4: an abated condition is never active.
    clinicalStatus: { coding: [{ system: CONDITION_CLINICAL, code: kase.closedOn ? 'resolved' : 'active' }] },
    category: [{ coding: [{ system: CONDITION_CATEGORY, code: 'problem-list-item' }] }],
    code: text(kase.diagnosis ?? `Injury or pain: ${regionsText(kase.bodyRegions)}`),
    bodySite: kase.bodyRegions.map((r) => text(BODY_REGION_LABELS[r])),
    subject: ref(athlete.membershipId),
    onsetDateTime: kase.onsetDate,
    ...(kase.closedOn ? { abatementDateTime: kase.closedOn } : {}),
    recordedDate: kase.openedAt.toISOString(),
    ...(kase.openedBy ? { recorder: ref(kase.openedBy) } : {}),
  };
  const observations: Json[] = input.painReports.map((r) => ({
    resourceType: 'Observation',
    id: r.id,
    status: 'final',
    category: [{ coding: [{ system: OBSERVATION_CATEGORY, code: 'survey' }] }],
    code: { coding: [PAIN_LOINC], text: 'Pain now, 0-10' },
    subject: ref(athlete.membershipId),
    focus: [ref(kase.id)],
    effectiveDateTime: r.reportedAt.toISOString(),
    performer: [ref(athlete.membershipId)],
    valueInteger: painScore(r.painNow),
    ...(r.bodyRegions.length ? { bodySite: text(regionsText(r.bodyRegions)) } : {}),
  }));
  const documents: Json[] = input.letters.map((l) => ({
    resourceType: 'DocumentReference',
    id: l.id,
    status: l.status === 'signed' ? 'current' : 'superseded',
    docStatus: 'final',
    type: text('Clearance letter'),
    subject: ref(athlete.membershipId),
    date: l.signedAt.toISOString(),
    ...(l.createdBy ? { author: [ref(l.createdBy)] } : {}),
    description: `Clearance letter (${l.decision === 'full' ? 'full participation' : 'limited participation'}) from ${l.effectiveFrom}`,
    content: [
      {
        attachment: {
          contentType: 'application/pdf',
          data: l.pdf.toString('base64'),
          size: l.pdf.length,
          hash: createHash('sha1').update(l.pdf).digest('base64'),
          title: `clearance-letter-${l.effectiveFrom}.pdf`,
          creation: l.signedAt.toISOString(),
        },
      },
    ],
    context: { related: [ref(kase.id)] },
  }));
  const resources = [
    patient,
    ...input.practitioners.map(practitioner),
    condition,
    ...observations,
    ...(input.plan ? [carePlan(input, input.plan)] : []),
    ...documents,
  ];
  return {
    resourceType: 'Bundle',
    type: 'collection',
    timestamp: input.now.toISOString(),
    entry: resources.map((r) => ({ fullUrl: `urn:uuid:${String(r.id)}`, resource: r })),
  };
}
