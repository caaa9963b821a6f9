import { useState } from 'react';
import type { StageCriteriaDto, StageCriterionView } from '../../../../../policies/dto';
import type { AgreeingParty } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { ChoiceGroup, TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { ApiError } from '../../../lib/api-client';
import { formatDate } from '../../../lib/format';
import { useAdvanceStage, useRecordAssessment, useStageCriteria } from '../api/stage-criteria';

/** The field problems of a 400, or undefined when the error is of another kind (then shown whole). */
function fieldErrors(error: unknown): Record<string, string[]> | undefined {
  const fields = error instanceof ApiError ? error.fields : undefined;
  return fields && Object.keys(fields).length ? fields : undefined;
}

/** Each state is a word and a glyph, never colour alone. */
export const STATE_WORDS = { met: '✓ Met', not_met: '… Not yet', waiting: '○ Nothing yet' } as const;

const stageName = (s: { number: number; label: string | null }) => `stage ${s.number}${s.label ? ` (${s.label})` : ''}`;

/** The care team's view on the case: every criterion with its state and evidence, assessments, and the decision to move on. */
export function StageCriteriaPanel({ orgId, planId }: { orgId: string; planId: string }) {
  const q = useStageCriteria(orgId, planId);
  if (q.isPending) return <Loading what="the stage criteria" />;
  if (q.isError) return <ErrorNotice error={q.error} />;
  const d = q.data;
  if (!d.stage) return null;
  return (
    <section aria-label="Stage criteria" className="space-y-3 rounded-md border border-rule p-3">
      <h3 className="font-semibold">
        Criteria to leave {stageName(d.stage)} — {d.metCount} of {d.criteria.length} met
      </h3>
      {d.criteria.length === 0 ? (
        <p className="text-sm text-muted">This stage has no exit criteria: it moves on by its dates.</p>
      ) : (
        <ul className="space-y-2 text-sm">
          {d.criteria.map((c) => (
            <CriterionRow key={c.criterion.id} orgId={orgId} planId={planId} view={c} data={d} />
          ))}
        </ul>
      )}
      {d.promptToMove && d.nextStage && (
        <Notice tone="done" role="status" title={`Every criterion is met. Move on to ${stageName(d.nextStage)}?`}>
          <p>The app never moves a stage by itself: decide with the athlete (and family), then record who agreed below.</p>
        </Notice>
      )}
      {d.canAssess && d.nextStage && <AdvanceForm orgId={orgId} planId={planId} data={d} />}
      {d.decisions.length > 0 && (
        <div className="text-sm">
          <p className="font-semibold">Decisions</p>
          <ul className="list-disc pl-5">
            {d.decisions.map((x) => (
              <li key={x.id}>
                From {formatDate(x.effectiveDate)}
                {x.daysEarly > 0 ? `, ${x.daysEarly} days early` : x.daysEarly < 0 ? `, ${-x.daysEarly} days late` : ''}; {x.criteriaMet} of{' '}
                {x.criteriaTotal} criteria met; agreed with {x.agreedBy.join(', ')}
                {x.decidedByName && ` — recorded by ${x.decidedByName}`}
                {x.note && ` (“${x.note}”)`}
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}

function CriterionRow({ orgId, planId, view, data }: { orgId: string; planId: string; view: StageCriterionView; data: StageCriteriaDto }) {
  const [open, setOpen] = useState(false);
  const c = view.criterion;
  return (
    <li className="border-l-2 border-rule pl-3">
      <p>
        <span className="font-semibold">{STATE_WORDS[view.result.state]}</span> — {c.kind === 'clinician' ? c.label : view.plain}
      </p>
      <p className="text-muted">{view.result.evidence}</p>
      {c.kind === 'clinician' && data.canAssess && (
        <>
          {!open && (
            <Button size="sm" variant="secondary" onClick={() => setOpen(true)}>
              Record an assessment
            </Button>
          )}
          {open && (
            <AssessmentForm
              orgId={orgId}
              planId={planId}
              stageId={data.stage!.id}
              view={view}
              today={data.today}
              onDone={() => setOpen(false)}
            />
          )}
        </>
      )}
    </li>
  );
}

function AssessmentForm(props: {
  orgId: string;
  planId: string;
  stageId: string;
  view: StageCriterionView;
  today: string;
  onDone: () => void;
}) {
  const c = props.view.criterion;
  const record = useRecordAssessment(props.orgId, props.planId);
  const [date, setDate] = useState(props.today);
  const [value, setValue] = useState('');
  const [met, setMet] = useState<'yes' | 'no' | undefined>(undefined);
  const [note, setNote] = useState('');
  if (c.kind !== 'clinician') return null;
  const fields = fieldErrors(record.error);
  return (
    <form
      className="mt-2 space-y-2"
      onSubmit={(e) => {
        e.preventDefault();
        record.mutate(
          {
            stageId: props.stageId,
            criterionId: c.id,
            date,
            ...(c.measure === 'threshold'
              ? { value: value.trim() === '' ? null : Number(value) }
              : { met: met === undefined ? null : met === 'yes' }),
            ...(note.trim() ? { note: note.trim() } : {}),
          },
          { onSuccess: props.onDone },
        );
      }}
    >
      <TextField label="Date" type="date" value={date} onChange={(e) => setDate(e.target.value)} error={fields?.date?.[0]} />
      {c.measure === 'threshold' ? (
        <TextField
          label={`Measured value${c.unit ? ` (${c.unit})` : ''}`}
          inputMode="decimal"
          value={value}
          onChange={(e) => setValue(e.target.value)}
          hint={`Met at ${c.direction === 'at_most' ? 'or under' : 'or over'} ${c.threshold}`}
          error={fields?.value?.[0]}
        />
      ) : (
        <ChoiceGroup
          legend="Judgement"
          name={`met-${c.id}`}
          options={[
            { value: 'yes', label: 'Yes' },
            { value: 'no', label: 'No' },
          ]}
          value={met}
          onChange={setMet}
          error={fields?.met?.[0] ?? fields?.value?.[0]}
        />
      )}
      <TextAreaField label="Note (care team only)" value={note} onChange={(e) => setNote(e.target.value)} rows={2} />
      {record.isError && !fields && <ErrorNotice error={record.error} />}
      <div className="flex gap-2">
        <Button type="submit" size="sm" busy={record.isPending}>
          Save assessment
        </Button>
        <Button size="sm" variant="secondary" onClick={props.onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

const PARTIES: { value: AgreeingParty; label: string }[] = [
  { value: 'athlete', label: 'The athlete' },
  { value: 'guardian', label: 'A parent or guardian' },
  { value: 'coach', label: 'The coach' },
];

function AdvanceForm({ orgId, planId, data }: { orgId: string; planId: string; data: StageCriteriaDto }) {
  const advance = useAdvanceStage(orgId, planId);
  const [open, setOpen] = useState(false);
  const [date, setDate] = useState(data.today);
  const [agreedBy, setAgreedBy] = useState<AgreeingParty[]>([]);
  const [note, setNote] = useState('');
  const next = data.nextStage!;
  const fields = fieldErrors(advance.error);
  if (!open) {
    return (
      <Button size="sm" variant={data.promptToMove ? 'primary' : 'secondary'} onClick={() => setOpen(true)}>
        Move to {stageName(next)}…
      </Button>
    );
  }
  return (
    <form
      aria-label="Move to the next stage"
      className="space-y-2"
      onSubmit={(e) => {
        e.preventDefault();
        advance.mutate(
          {
            fromStageId: data.stage!.id,
            effectiveDate: date,
            agreedBy,
            version: data.planVersion,
            ...(note.trim() ? { note: note.trim() } : {}),
          },
          { onSuccess: () => setOpen(false) },
        );
      }}
    >
      <p className="text-sm">
        Planned start of {stageName(next)}: {formatDate(next.startDate)}. {data.metCount} of {data.criteria.length} criteria met.
      </p>
      <TextField label="From" type="date" value={date} onChange={(e) => setDate(e.target.value)} error={fields?.effectiveDate?.[0]} />
      <ChoiceGroup
        multiple
        legend="Who agreed"
        name="agreed-by"
        options={PARTIES}
        value={agreedBy}
        onChange={setAgreedBy}
        error={fields?.agreedBy?.[0]}
      />
      <TextAreaField label="Note" value={note} onChange={(e) => setNote(e.target.value)} rows={2} />
      {advance.isError && !fields && <ErrorNotice error={advance.error} />}
      <div className="flex gap-2">
        <Button type="submit" size="sm" busy={advance.isPending}>
          Record the decision and move on
        </Button>
        <Button size="sm" variant="secondary" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
