import { useId, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { PlanStage } from '../../../../../policies/load/in-force';
import { planStagesFromTemplate } from '../../../../../policies/load/plan-template';
import { Button } from '../../../components/ui/Button';
import { todayLocal } from '../../../lib/dates';
import { planTemplateQueryOptions, usePlanTemplates } from '../api/plan-templates';

/**
 * "Start from a template" in the plan editor: pick a template and a start date, and its stages are
 * dated from that day (policies/load/plan-template.ts) and put in the editor, where everything can
 * still be changed before the plan is saved. Nothing is saved here.
 */
export function StartFromTemplate({
  orgId,
  onStages,
}: {
  orgId: string;
  onStages: (stages: PlanStage[], guidance: string, template: { id: string; version: number; name: string }) => void;
}) {
  const queryClient = useQueryClient();
  // Asked for only when wanted: most plans are written from a blank stage or an earlier plan.
  const [open, setOpen] = useState(false);
  const templates = usePlanTemplates(orgId, open);
  const pickId = useId();
  const dateId = useId();
  const [templateId, setTemplateId] = useState('');
  const [startDate, setStartDate] = useState(todayLocal());
  const [message, setMessage] = useState<string | null>(null);

  if (!open)
    return (
      <Button variant="secondary" onClick={() => setOpen(true)}>
        Start from a template
      </Button>
    );
  if (templates.isPending) return <p className="text-sm text-ink-2">Loading the templates…</p>;
  if (!templates.data || templates.data.length === 0)
    return <p className="text-sm text-ink-2">Your organization has no plan templates yet. Save a plan as a template from its case.</p>;

  async function start() {
    const t = await queryClient.fetchQuery(planTemplateQueryOptions(orgId, templateId)).catch(() => null);
    if (!t) {
      setMessage('That template could not be loaded. Try again, or start from the blank stage.');
      return;
    }
    onStages(
      planStagesFromTemplate(t.stages, startDate, () => crypto.randomUUID()),
      t.guidance,
      { id: t.id, version: t.version, name: t.name },
    );
    setMessage(
      `Started from “${t.name}”: ${t.stages.length} ${t.stages.length === 1 ? 'stage' : 'stages'} dated from the start you chose. ` +
        'Check each stage and change what this athlete needs before saving.',
    );
  }

  return (
    <div className="flex flex-wrap items-end gap-2 rounded-md border border-rule p-3">
      <div className="min-w-0 flex-1 sm:flex-none">
        <label htmlFor={pickId} className="block text-sm font-semibold">
          Template
        </label>
        <select
          id={pickId}
          value={templateId}
          onChange={(e) => setTemplateId(e.target.value)}
          className="mt-1 block min-h-10 w-full rounded-md border border-rule-strong bg-sheet px-2 text-sm sm:w-80"
        >
          <option value="">Choose a template</option>
          {templates.data.map((t) => (
            <option key={t.id} value={t.id}>
              {t.name} ({t.stageCount} {t.stageCount === 1 ? 'stage' : 'stages'}, {t.lengthDays} days)
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor={dateId} className="block text-sm font-semibold">
          First day of the plan
        </label>
        <input
          id={dateId}
          type="date"
          value={startDate}
          onChange={(e) => setStartDate(e.target.value)}
          className="mt-1 block min-h-10 rounded-md border border-rule-strong bg-sheet px-2 text-sm"
        />
      </div>
      <Button variant="secondary" disabled={!templateId || !/^\d{4}-\d{2}-\d{2}$/.test(startDate)} onClick={() => void start()}>
        Use this template
      </Button>
      {message && (
        <p role="status" className="w-full text-sm text-ink-2">
          {message}
        </p>
      )}
    </div>
  );
}
