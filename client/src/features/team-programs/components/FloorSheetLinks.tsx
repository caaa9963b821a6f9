import { buttonClass } from '../../../components/ui/Button';

/** Where the server serves a team session's floor sheet (server/src/routes/team-programs/floor-sheet.router.ts). */
export const floorSheetHref = (orgId: string, teamSessionId: string, format: 'pdf' | 'csv') =>
  `/api/orgs/${encodeURIComponent(orgId)}/team-sessions/${encodeURIComponent(teamSessionId)}/floor-sheet.${format}`;

/**
 * The floor sheet of one team session: a PDF to print and tape to the rack (each athlete's own loads
 * and plates, fitted rows marked) and the same rows as CSV. Plain download links: the browser sends
 * the session cookie, and the server audits each download.
 */
export function FloorSheetLinks({ orgId, teamSessionId }: { orgId: string; teamSessionId: string }) {
  return (
    <p className="flex flex-wrap items-center gap-2">
      <a href={floorSheetHref(orgId, teamSessionId, 'pdf')} download className={buttonClass('secondary', 'sm')}>
        Floor sheet (PDF)
      </a>
      <a href={floorSheetHref(orgId, teamSessionId, 'csv')} download className={buttonClass('secondary', 'sm')}>
        <span className="sr-only">Floor sheet as </span>CSV
      </a>
    </p>
  );
}
