import { useState } from 'react';
import type { Unit } from '../../../../../policies/schemas';
import type { PlanDto } from '../../../../../policies/dto';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { Tabs } from '../../../components/ui/Tabs';
import { formatDateTime } from '../../../lib/format';
import { todayLocal } from '../../../lib/dates';
import { usePlan } from '../api/get-plan';
import { PlanEditor, type CopySource } from './PlanEditor';
import { PlanStagesView } from './PlanStagesView';
import { PlanVersions } from './PlanVersions';
import { SaveAsTemplate } from '../../plan-templates/components/SaveAsTemplate';
import { StageCriteriaPanel } from '../../stage-criteria/components/StageCriteriaPanel';

export interface PlanSectionProps {
  orgId: string;
  caseId: string;
  planId: string | null;
  unit: Unit;
  /** The case is closed: its plan can no longer change. */
  closed: boolean;
  canCreate: boolean;
  canUpdate: boolean;
  /** Plans of the athlete's other cases, to start a new plan from. */
  copySources: CopySource[];
}

/** The restriction plan of a case: write it, read it, edit it, and look back through its versions. */
export function PlanSection(props: PlanSectionProps) {
  const { orgId, caseId, unit, closed, canCreate, copySources } = props;
  const [writing, setWriting] = useState(false);
  // The case learns its plan id on its next fetch; until then, the id the save returned stands in.
  const [createdId, setCreatedId] = useState<string | null>(null);
  const planId = props.planId ?? createdId;

  if (!planId) {
    if (writing) {
      return (
        <PlanEditor
          orgId={orgId}
          caseId={caseId}
          unit={unit}
          copySources={copySources}
          onSaved={(saved) => {
            setCreatedId(saved.id);
            setWriting(false);
          }}
          onCancel={() => setWriting(false)}
        />
      );
    }
    return (
      <div className="space-y-2 text-sm">
        <p className="text-ink-2">
          No restriction plan yet. A plan sets, stage by stage, which movements are blocked, capped or free, and until when; the coach
          programs under it and the athlete sees it in plain words.
        </p>
        {canCreate && !closed ? (
          <Button onClick={() => setWriting(true)}>Write the restriction plan</Button>
        ) : closed ? (
          <p className="text-muted">This case is closed, so no plan can be written for it.</p>
        ) : null}
      </div>
    );
  }
  return <ExistingPlan {...props} planId={planId} />;
}

function ExistingPlan({ orgId, caseId, planId, unit, closed, canUpdate }: PlanSectionProps & { planId: string }) {
  const plan = usePlan(orgId, planId);
  const [tab, setTab] = useState<'current' | 'versions'>('current');
  const [editing, setEditing] = useState(false);
  const [savedVersion, setSavedVersion] = useState<number | null>(null);

  if (plan.isPending) return <Loading what="the plan" />;
  if (plan.isError) return <ErrorNotice error={plan.error} />;

  if (editing) {
    return (
      <PlanEditor
        orgId={orgId}
        caseId={caseId}
        unit={unit}
        plan={plan.data}
        onSaved={(saved: PlanDto) => {
          setSavedVersion(saved.version);
          setEditing(false);
        }}
        onCancel={() => setEditing(false)}
      />
    );
  }

  const current = plan.data.current;
  const currentPanel = (
    <div className="space-y-3">
      {savedVersion === plan.data.version && (
        <Notice tone="done" role="status">
          <p>Version {savedVersion} saved. The coach&apos;s view and the athlete&apos;s limits follow it now.</p>
        </Notice>
      )}
      <div className="flex flex-wrap items-start justify-between gap-2">
        <p className="text-sm text-ink-2">
          Version {plan.data.version}, saved {formatDateTime(current.createdAt)}
          {current.createdByName && ` by ${current.createdByName}`}
          {current.changeNote && <> — “{current.changeNote}”</>}
        </p>
        {canUpdate && !closed && (
          <Button variant="secondary" size="sm" onClick={() => setEditing(true)}>
            Edit plan
          </Button>
        )}
      </div>
      <PlanStagesView stages={current.stages} unit={unit} today={todayLocal()} />
      {canUpdate && <SaveAsTemplate orgId={orgId} planId={planId} />}
      {!closed && <StageCriteriaPanel orgId={orgId} planId={planId} />}
      <div>
        <p className="text-sm font-semibold">Guidance for the athlete and family</p>
        {current.guidance ? (
          <p className="mt-1 border-l-2 border-rule pl-3 text-sm whitespace-pre-wrap">{current.guidance}</p>
        ) : (
          <p className="mt-1 text-sm text-muted">none written</p>
        )}
      </div>
    </div>
  );

  if (!plan.data.canSeeHistory) return currentPanel;
  return (
    <Tabs
      label="Restriction plan"
      selected={tab}
      onSelect={setTab}
      items={[
        { key: 'current', label: 'Current plan', panel: currentPanel },
        { key: 'versions', label: 'Versions', panel: <PlanVersions orgId={orgId} planId={planId} /> },
      ]}
    />
  );
}
