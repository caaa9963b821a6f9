import type { BodyRegion } from '../../../policies/body-regions';
import type { PlanStage } from '../../../policies/load/in-force';
import type { Unit } from '../../../policies/schemas/common';
import { authorize } from '../core/authorize';
import { orgCommand } from '../core/command';
import { notFound } from '../core/errors';
import { CaseRecord } from '../entities';
import { caseBundle, type FhirCaseInput } from '../services/fhir-case-bundle';

/**
 * Download a case as an HL7 FHIR R4 Bundle, for a clinician on the athlete's care team to
 * take into a health record. A read, but recorded: the file carries the diagnosis, the pain reports
 * and the signed letter out of the app. Another team's case answers 404, like every record.
 */
export const downloadCaseFhir = orgCommand<{ id: string }, { body: string; filename: string }>({
  name: 'cases.export_fhir',
  async run(ctx, { id }) {
    const { m, actor } = ctx;
    const kase = await m.findOne(CaseRecord, { where: { id, organizationId: actor.organizationId } });
    if (!kase) throw notFound('case');
    authorize(ctx.ability, 'read', 'CaseExport', { organizationId: kase.organizationId, athleteId: kase.athleteId });
    authorize(ctx.ability, 'read', 'Case', { id: kase.id, organizationId: kase.organizationId, athleteId: kase.athleteId }, 'diagnosis');

    const [athlete]: { name: string; date_of_birth: string | null }[] = await m.query(
      `SELECT u.display_name AS name, p.date_of_birth FROM memberships mb JOIN users u ON u.id = mb.user_id
         LEFT JOIN athlete_profiles p ON p.membership_id = mb.id WHERE mb.id = $1`,
      [kase.athleteId],
    );
    const painReports: { id: string; reported_at: Date; pain_now: number; body_regions: BodyRegion[] }[] = await m.query(
      `SELECT id, reported_at, pain_now, body_regions FROM pain_reports WHERE case_id = $1 AND organization_id = $2 ORDER BY reported_at, id`,
      [kase.id, actor.organizationId],
    );
    const [plan]: { id: string; version: number; stages: PlanStage[]; created_by: string | null; created_at: Date }[] = await m.query(
      `SELECT p.id, p.version, v.stages, v.created_by, v.created_at FROM restriction_plans p
         JOIN restriction_plan_versions v ON v.plan_id = p.id AND v.version = p.version WHERE p.case_id = $1`,
      [kase.id],
    );
    // The athlete's signed letters taking effect from the case's onset (to its closing): letters are the
    // athlete's, not the case's, so the case's dates choose them.
    const letters: {
      id: string;
      status: 'signed' | 'superseded';
      signed_at: Date;
      effective_from: string;
      created_by: string | null;
      decision: 'full' | 'limited';
      pdf: Buffer;
      credential: string;
      licence_number: string;
      clinician_name: string;
    }[] = await m.query(
      `SELECT id, status, signed_at, effective_from, created_by, decision, pdf, credential, licence_number, clinician_name
         FROM clearance_letters
        WHERE athlete_id = $1 AND organization_id = $2 AND status IN ('signed', 'superseded') AND pdf IS NOT NULL
          AND effective_from >= $3::date AND ($4::date IS NULL OR effective_from <= $4::date)
        ORDER BY signed_at, id`,
      [kase.athleteId, actor.organizationId, kase.onsetDate, kase.closedOn],
    );
    const authorIds = [
      ...new Set([ctx.userId, kase.openedBy, plan?.created_by, ...letters.map((l) => l.created_by)].filter((x): x is string => !!x)),
    ];
    const people: { id: string; name: string; unit_pref: Unit }[] = await m.query(
      `SELECT id, display_name AS name, unit_pref FROM users WHERE id = ANY($1::uuid[])`,
      [authorIds],
    );
    const practitioners: FhirCaseInput['practitioners'] = people.map((p) => {
      // A letter names its signer's credential and licence as they signed it: the latest letter's words.
      const signed = letters.filter((l) => l.created_by === p.id).at(-1);
      return {
        userId: p.id,
        name: signed?.clinician_name ?? p.name,
        credential: signed?.credential,
        licenceNumber: signed?.licence_number,
      };
    });
    const bundle = caseBundle({
      now: ctx.now,
      today: ctx.today,
      unit: people.find((p) => p.id === ctx.userId)?.unit_pref ?? 'kg',
      organization: { id: actor.organizationId, name: actor.organizationName },
      athlete: { membershipId: kase.athleteId, name: athlete.name, dateOfBirth: athlete.date_of_birth },
      kase: {
        id: kase.id,
        bodyRegions: kase.bodyRegions,
        onsetDate: kase.onsetDate,
        diagnosis: kase.diagnosis,
        openedAt: kase.openedAt,
        closedOn: kase.closedOn,
        openedBy: kase.openedBy,
      },
      practitioners,
      painReports: painReports.map((r) => ({ id: r.id, reportedAt: r.reported_at, painNow: r.pain_now, bodyRegions: r.body_regions })),
      plan: plan
        ? { id: plan.id, version: plan.version, stages: plan.stages, createdBy: plan.created_by, createdAt: plan.created_at }
        : null,
      letters: letters.map((l) => ({
        id: l.id,
        status: l.status,
        signedAt: l.signed_at,
        effectiveFrom: l.effective_from,
        createdBy: l.created_by,
        decision: l.decision,
        pdf: l.pdf,
      })),
    });
    await ctx.audit({
      action: 'case.exported_fhir',
      subjectType: 'Case',
      subjectId: kase.id,
      athleteId: kase.athleteId,
      after: { painReports: painReports.length, letters: letters.length, plan: plan ? plan.version : null },
    });
    return { body: JSON.stringify(bundle), filename: `case-${kase.onsetDate}.fhir.json` };
  },
});
