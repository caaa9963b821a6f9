import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CaseDocumentDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { apiHref } from '../../../lib/upload';

/** Outside documents on one case, newest document date first. Only the care team's clinicians and the athlete get them. */
export function getCaseDocuments(orgId: string, caseId: string): Promise<CaseDocumentDto[]> {
  return api.get<CaseDocumentDto[]>(`/orgs/${orgId}/cases/${caseId}/documents`);
}

export function getCaseDocumentsQueryOptions(orgId: string, caseId: string) {
  return queryOptions({ queryKey: queryKeys.caseDocuments(orgId, caseId), queryFn: () => getCaseDocuments(orgId, caseId) });
}

export function useCaseDocuments(orgId: string, caseId: string) {
  return useQuery(getCaseDocumentsQueryOptions(orgId, caseId));
}

/** A link rather than a fetch: the server answers with an attachment, which the browser saves. */
export function documentHref(orgId: string, doc: CaseDocumentDto): string {
  return doc.downloadPath ? apiHref(doc.downloadPath) : `/api/orgs/${orgId}/documents/${doc.id}/file`;
}
