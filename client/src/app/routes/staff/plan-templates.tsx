import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import type { PlanTemplateDto } from '../../../../../policies/dto';
import {
  planTemplateQueryOptions,
  useArchivePlanTemplate,
  useCopyPlanTemplate,
  usePlanTemplate,
  usePlanTemplates,
} from '../../../features/plan-templates/api/plan-templates';
import { TemplateEditor } from '../../../features/plan-templates/components/TemplateEditor';
import { TemplateStagesView } from '../../../features/plan-templates/components/TemplateStagesView';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Facts, Loading, PageHeader, Panel } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export const CLINICIAN_TEMPLATES_PATH = '/clinician/plan-templates';
export const ADMIN_TEMPLATES_PATH = '/admin/plan-templates';

const stagesWords = (n: number) => `${n} ${n === 1 ? 'stage' : 'stages'}`;

function NotForYou() {
  return (
    <Notice tone="problem" role="alert" title="You can't do that">
      <p>Plan templates are for the organization&apos;s clinicians and admins.</p>
      <p>
        <Link to="/">Go to your home page</Link>
      </p>
    </Notice>
  );
}

/** The organization's plan templates in use: who wrote each, its version, its stages and length. */
export function PlanTemplatesPage({ base }: { base: string }) {
  useDocumentTitle('Plan templates');
  const { orgId } = useCurrentMembership();
  const ability = useAppAbility();
  const canRead = ability.can('read', 'PlanTemplate');
  const list = usePlanTemplates(orgId, canRead);
  if (!canRead) return <NotForYou />;
  return (
    <div className="space-y-5">
      <PageHeader title="Plan templates">
        Your organization&apos;s restriction plans kept as days from a plan&apos;s first day. Start a plan from one in a case&apos;s plan
        editor; save a plan as one from its case. Each template belongs to its author: others copy it to make it their own.
      </PageHeader>
      {list.isPending ? (
        <Loading what="the templates" />
      ) : list.isError ? (
        <ErrorNotice error={list.error} />
      ) : list.data.length === 0 ? (
        <p className="text-sm text-ink-2">No plan templates yet. Save a plan as a template from its case.</p>
      ) : (
        <ul className="space-y-3" aria-label="Templates">
          {list.data.map((t) => (
            <li key={t.id} className="rounded-lg border border-rule bg-sheet p-4">
              <h2 className="text-lg font-bold">
                <Link to={`${base}/${t.id}`} className="underline underline-offset-2">
                  {t.name}
                </Link>
              </h2>
              <p className="text-sm text-ink-2 tabular-nums">
                By {t.authorName} · version {t.version} · {stagesWords(t.stageCount)}, {t.lengthDays} days · changed{' '}
                {formatDateTime(t.updatedAt)}
              </p>
              {t.description && <p className="mt-1 text-sm whitespace-pre-wrap">{t.description}</p>}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** One template: its stages; edit and archive for its author or an admin, copy for anyone else. */
export function PlanTemplatePage({ base }: { base: string }) {
  const { templateId = '' } = useParams();
  const { orgId, user } = useCurrentMembership();
  const ability = useAppAbility();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const q = usePlanTemplate(orgId, templateId);
  const copy = useCopyPlanTemplate(orgId);
  const archive = useArchivePlanTemplate(orgId, templateId);
  const [editing, setEditing] = useState(false);
  const [saved, setSaved] = useState<number | null>(null);
  useDocumentTitle(q.data ? `Plan template: ${q.data.name}` : 'Plan template');
  if (!ability.can('read', 'PlanTemplate')) return <NotForYou />;
  if (q.isPending) return <Loading what="the template" />;
  if (q.isError) return <ErrorNotice error={q.error} />;
  const t = q.data;
  const canCopy = ability.can('create', 'PlanTemplate');
  const archived = !t.canEdit && archive.isSuccess;

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link to={base} className="underline underline-offset-2">
          ← Plan templates
        </Link>
      </p>
      <PageHeader title={`Plan template: ${t.name}`}>
        By {t.authorName} · version {t.version} · {stagesWords(t.stageCount)}, {t.lengthDays} days
      </PageHeader>
      {saved === t.version && (
        <Notice tone="done" role="status">
          <p>Version {saved} saved. Plans already started from it keep their own stages.</p>
        </Notice>
      )}
      {archived && (
        <Notice tone="done" role="status">
          <p>Archived. It has left the list; plans started from it keep their own stages.</p>
        </Notice>
      )}
      {editing ? (
        <Panel title="Edit the template">
          <TemplateEditor
            orgId={orgId}
            template={t}
            unit={user.unitPref}
            onSaved={(next: PlanTemplateDto) => {
              setSaved(next.version);
              setEditing(false);
            }}
            onCancel={() => setEditing(false)}
            onLoadLatest={() => queryClient.fetchQuery({ ...planTemplateQueryOptions(orgId, t.id), staleTime: 0 }).catch(() => null)}
          />
        </Panel>
      ) : (
        <>
          <Panel title="About this template">
            <Facts
              items={[
                { label: 'Author', value: t.authorName },
                { label: 'Version', value: `${t.version}, changed ${formatDate(t.updatedAt.slice(0, 10))}` },
                { label: 'Length', value: `${stagesWords(t.stageCount)}, ${t.lengthDays} days` },
              ]}
            />
            {t.description && <p className="mt-3 text-sm whitespace-pre-wrap">{t.description}</p>}
            <div className="mt-3 flex flex-wrap gap-2">
              {t.canEdit && <Button onClick={() => setEditing(true)}>Edit template</Button>}
              {!t.canEdit && canCopy && !archived && (
                <Button
                  busy={copy.isPending}
                  onClick={() => copy.mutate(t.id, { onSuccess: (mine) => void navigate(`${base}/${mine.id}`) })}
                >
                  Copy as my own
                </Button>
              )}
              {t.canEdit && (
                <Button variant="danger" busy={archive.isPending} onClick={() => archive.mutate(t.version)}>
                  Archive
                </Button>
              )}
            </div>
            {!t.canEdit && !archived && (
              <p className="mt-2 text-sm text-muted">Only its author or an admin changes this template. A copy is yours to change.</p>
            )}
            {copy.error && <ErrorNotice error={copy.error} className="mt-3" />}
            {archive.error && <ErrorNotice error={archive.error} className="mt-3" />}
          </Panel>
          <Panel title="Stages">
            <TemplateStagesView stages={t.stages} unit={user.unitPref} />
          </Panel>
          <Panel title="Guidance for the athlete and family">
            {t.guidance ? <p className="text-sm whitespace-pre-wrap">{t.guidance}</p> : <p className="text-sm text-muted">none written</p>}
          </Panel>
        </>
      )}
    </div>
  );
}
