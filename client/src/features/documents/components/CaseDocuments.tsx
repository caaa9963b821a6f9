import { useState } from 'react';
import { asSubject } from '../../../../../policies/access';
import type { CaseDocumentDto } from '../../../../../policies/dto';
import { Button, buttonClass } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, Panel } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useDeleteCaseDocument } from '../api/delete-case-document';
import { documentHref, useCaseDocuments } from '../api/get-case-documents';
import { AttachDocumentForm } from './AttachDocumentForm';
import { DocumentsCaution } from './DocumentsCaution';
import { documentTypeWords, fileSizeWords } from './document-words';

/**
 * Outside documents on one case (a physician's note, an imaging report, a referral) for the
 * clinicians on the care team and the athlete. Nobody else is given this section: the caller mounts
 * it only on those people's pages, and the server answers 404 to anyone else anyway.
 */
export function CaseDocuments({
  orgId,
  caseId,
  athleteId,
  athleteName,
  audience,
  title = 'Documents',
  closed = false,
}: {
  orgId: string;
  caseId: string;
  athleteId: string;
  athleteName: string;
  audience: 'clinician' | 'athlete';
  title?: string;
  /** A closed case keeps its documents but takes no new ones. */
  closed?: boolean;
}) {
  const ability = useAppAbility();
  const documents = useCaseDocuments(orgId, caseId);
  const [attaching, setAttaching] = useState(false);
  const [added, setAdded] = useState(false);
  const canAttach =
    !closed && ability.can('create', asSubject('CaseDocument', { id: '', organizationId: orgId, athleteId, uploadedByUserId: '' }));

  return (
    <Panel
      title={title}
      actions={
        canAttach &&
        !attaching && (
          <Button
            variant="primary"
            size={audience === 'athlete' ? 'lg' : 'md'}
            onClick={() => {
              setAttaching(true);
              setAdded(false);
            }}
          >
            Attach a document
          </Button>
        )
      }
    >
      <div className="space-y-4">
        <DocumentsCaution athleteName={athleteName} audience={audience} />
        {added && (
          <Notice tone="done" role="status">
            <p>Document attached.</p>
          </Notice>
        )}
        {attaching && (
          <section aria-label="New document" className="rounded-md border border-rule-strong p-3 sm:p-4">
            <AttachDocumentForm
              orgId={orgId}
              caseId={caseId}
              large={audience === 'athlete'}
              onDone={() => {
                setAttaching(false);
                setAdded(true);
              }}
              onCancel={() => setAttaching(false)}
            />
          </section>
        )}
        {documents.isPending ? (
          <Loading what="documents" />
        ) : documents.isError ? (
          <ErrorNotice error={documents.error} />
        ) : documents.data.length === 0 ? (
          <p className="text-sm text-ink-2">
            No documents on this case yet. {canAttach && 'Attach a physician’s note, an imaging report or a referral as a PDF or a photo.'}
          </p>
        ) : (
          <ul className="space-y-2" aria-label={`Documents on this case (${documents.data.length})`}>
            {documents.data.map((doc) => (
              <DocumentRow key={doc.id} orgId={orgId} caseId={caseId} doc={doc} />
            ))}
          </ul>
        )}
      </div>
    </Panel>
  );
}

function DocumentRow({ orgId, caseId, doc }: { orgId: string; caseId: string; doc: CaseDocumentDto }) {
  const ability = useAppAbility();
  const remove = useDeleteCaseDocument(orgId, caseId);
  const [confirming, setConfirming] = useState(false);
  const canRemove = ability.can(
    'delete',
    asSubject('CaseDocument', { id: doc.id, organizationId: orgId, athleteId: doc.athleteId, uploadedByUserId: doc.uploadedByUserId }),
  );

  return (
    <li>
      <article aria-label={doc.title} className="rounded-md border border-rule px-3 py-2 text-sm">
        <div className="flex flex-wrap items-start justify-between gap-2">
          <div className="min-w-0">
            <h3 className="font-semibold break-words">{doc.title}</h3>
            <p className="text-ink-2 tabular-nums">
              {doc.issuedBy} · dated {formatDate(doc.documentDate)}
            </p>
            <p className="text-muted tabular-nums">
              {documentTypeWords(doc.mediaType)}, {fileSizeWords(doc.sizeBytes)} · added by {doc.uploadedByName},{' '}
              {formatDateTime(doc.uploadedAt)}
            </p>
          </div>
          <div className="flex flex-wrap gap-2">
            <a href={documentHref(orgId, doc)} className={buttonClass('secondary', 'sm')} aria-label={`Download ${doc.title}`}>
              Download
            </a>
            {canRemove && !confirming && (
              <Button variant="quiet" size="sm" onClick={() => setConfirming(true)} aria-label={`Remove ${doc.title}`}>
                Remove
              </Button>
            )}
          </div>
        </div>
        {confirming && (
          <div role="group" aria-label="Confirm removal" className="mt-2 space-y-2 border-t border-rule pt-2">
            <ErrorNotice error={remove.error} />
            <p>Remove “{doc.title}” from this case? The file is deleted; the audit trail keeps that it was here.</p>
            <div className="flex flex-wrap gap-2">
              <Button variant="danger" size="sm" busy={remove.isPending} onClick={() => remove.mutate(doc.id)}>
                Yes, remove it
              </Button>
              <Button variant="secondary" size="sm" onClick={() => setConfirming(false)} autoFocus>
                Keep it
              </Button>
            </div>
          </div>
        )}
      </article>
    </li>
  );
}
