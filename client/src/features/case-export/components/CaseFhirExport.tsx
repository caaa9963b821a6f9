import { buttonClass } from '../../../components/ui/Button';
import { Panel } from '../../../components/ui/Panel';

/** Where the server serves a case as a FHIR R4 Bundle (server/src/routes/exports/case-fhir.router.ts). */
export const caseFhirHref = (orgId: string, caseId: string) =>
  `/api/orgs/${encodeURIComponent(orgId)}/cases/${encodeURIComponent(caseId)}/fhir`;

/**
 * The case for a health record: one FHIR R4 file with the patient, the condition, the pain scores,
 * the restriction plan and the signed letter. A plain download link: the browser sends the session
 * cookie, and the server checks the care team and audits each download.
 */
export function CaseFhirExport({ orgId, caseId }: { orgId: string; caseId: string }) {
  return (
    <Panel title="Health record export">
      <div className="space-y-3 text-sm">
        <p>
          One file in the FHIR R4 standard for a health record system: the athlete, this case (body site, onset, whether it is active), the
          pain scores reported on it, the restriction plan with its stages, and the signed clearance letters with their PDFs. Clinical notes
          and pain narratives stay here.
        </p>
        <p>
          <a href={caseFhirHref(orgId, caseId)} download className={buttonClass('secondary', 'sm')}>
            Download for a health record (FHIR)
          </a>
        </p>
        <p className="text-ink-2">Each download is recorded in the audit trail.</p>
      </div>
    </Panel>
  );
}
