import { NothingSchema, OrgItemParamsSchema } from '../../../../policies/schemas';
import { downloadCaseFhir } from '../../commands/case-export';
import { orgRoute, type RouteDef } from '../../http/route';

/**
 * A case as an HL7 FHIR R4 Bundle: the clinician on the care team downloads it to bring the
 * case into a health record. An attachment, never cached, and audited (case.exported_fhir).
 */
export const caseFhirRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/cases/:id/fhir',
    summary:
      'The case as a FHIR R4 Bundle: patient, condition, pain scores, the restriction plan and the signed letter (clinicians on the care team; audited, never cached)',
    access: { kind: 'org', action: 'read', subject: 'CaseExport' },
    command: downloadCaseFhir,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ run, params, res }) {
      const { body, filename } = await run(downloadCaseFhir, { id: params.id });
      res.setHeader('Content-Type', 'application/fhir+json; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
      res.setHeader('Cache-Control', 'no-store');
      res.status(200).send(body);
      return body;
    },
  }),
];
