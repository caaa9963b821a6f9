import { useEffect, useId, useRef, useState, type FormEvent, type ReactNode } from 'react';
import { Controller, useForm, useWatch, type FieldErrors, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { PainReportCreateSchema } from '../../../../../policies/schemas';
import type { PainReportOutcomeDto } from '../../../../../policies/dto';
import { MOVEMENT_PATTERNS, PATTERN_LABELS } from '../../../../../policies/load/patterns';
import type { BodyRegion } from '../../../../../policies/body-regions';
import { includesBackOrPelvis, redFlagQuestionsFor, routeReport, type RedFlagItem } from '../../../../../policies/red-flags';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { emptyToUndefined } from '../../../lib/form-values';
import { todayLocal } from '../../../lib/dates';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { ScoreField } from '../../../components/ui/ScoreField';
import { useCreatePainReport } from '../api/create-pain-report';
import { BodyMap } from './BodyMap';
import { EmergencyScreen, KeptOutcome, ReportOutcome } from './ReportOutcome';
import { PAIN_HIGH, PAIN_LOW, PATTERN_EXAMPLES } from './report-words';
import { YesNo } from './YesNo';

type Input = z.input<typeof PainReportCreateSchema>;
type Output = z.output<typeof PainReportCreateSchema>;

const DETAIL_FIELDS = ['bodyRegions', 'painNow', 'painWorst24h', 'onsetDate', 'aggravatingPatterns', 'startedInTraining', 'note'] as const;
const PATTERN_OPTIONS = MOVEMENT_PATTERNS.map((p) => ({ value: p, label: PATTERN_LABELS[p], hint: PATTERN_EXAMPLES[p] }));
const UNANSWERED = 'Answer Yes or No.';

function unansweredCount(errors: FieldErrors<Input>, asked: readonly RedFlagItem[]): number {
  const flags = errors.redFlags as Record<string, unknown> | undefined;
  return flags ? asked.filter((i) => flags[i.id]).length : 0;
}

const schemaResolver = zodResolver(PainReportCreateSchema);

/**
 * Answers to questions the chosen places no longer ask (the athlete picked the back, answered, then
 * took it off) are left out before checking and sending, so the server sees exactly the screen shown.
 */
const resolver: Resolver<Input, unknown, Output> = (values, context, options) => {
  const asked = new Set(redFlagQuestionsFor((values.bodyRegions ?? []) as BodyRegion[]).map((i) => i.id));
  const redFlags = Object.fromEntries(Object.entries(values.redFlags ?? {}).filter(([id]) => asked.has(id)));
  return schemaResolver({ ...values, redFlags }, context, options);
};

/**
 * Reporting pain in two short screens: where and how much, then the warning-sign questions. The
 * outcome replaces the form; for an emergency it is the whole screen.
 */
export function PainReportForm({
  orgId,
  athleteId,
  emergencyNumber,
  homeHref,
  onOutcome,
  onKept,
}: {
  orgId: string;
  athleteId: string;
  /** The organization's number, for the emergency advice if the report cannot be sent. */
  emergencyNumber: string | null | undefined;
  homeHref: string;
  onOutcome?: (outcome: PainReportOutcomeDto) => void;
  /** Loadline could not be reached: the report is kept on the phone and sent later (lib/offline-queue.ts). */
  onKept?: () => void;
}) {
  const create = useCreatePainReport(orgId);
  const [step, setStep] = useState<1 | 2>(1);
  const [outcome, setOutcome] = useState<PainReportOutcomeDto | null>(null);
  const [triedToSend, setTriedToSend] = useState(false);
  const [detailsIncomplete, setDetailsIncomplete] = useState(false);
  const [emergencyUnsent, setEmergencyUnsent] = useState<{ error: unknown; values: Output } | null>(null);
  // Emergency answers show the stop-and-get-care screen at once, before (and without) the server's answer.
  const [emergencyFirst, setEmergencyFirst] = useState<'sending' | 'kept' | null>(null);
  const [kept, setKept] = useState<{ urgent: boolean } | null>(null);
  const stepHeading = useRef<HTMLHeadingElement>(null);
  const questionRefs = useRef(new Map<string, HTMLDivElement>());
  const today = todayLocal();

  const {
    control,
    register,
    handleSubmit,
    trigger,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver,
    defaultValues: { athleteId, bodyRegions: [], aggravatingPatterns: [], onsetDate: today, redFlags: {} },
  });

  const regions = (useWatch({ control, name: 'bodyRegions' }) ?? []) as BodyRegion[];
  const asked = redFlagQuestionsFor(regions);
  const backAsked = includesBackOrPelvis(regions);

  useEffect(() => {
    if (step === 2) stepHeading.current?.focus();
  }, [step]);

  async function toWarningSigns() {
    const ok = await trigger([...DETAIL_FIELDS], { shouldFocus: true });
    setDetailsIncomplete(!ok);
    if (ok) setStep(2);
  }

  function send(values: Output) {
    const route = routeReport(values.redFlags);
    if (route === 'emergency') setEmergencyFirst('sending');
    create.mutate(values, {
      onSuccess: (result) => {
        setEmergencyUnsent(null);
        if ('kept' in result) {
          if (route === 'emergency') setEmergencyFirst('kept');
          else setKept({ urgent: route === 'urgent' });
          onKept?.();
          return;
        }
        setEmergencyFirst(null);
        setOutcome(result.sent);
        onOutcome?.(result.sent);
      },
      onError: (error) => {
        setEmergencyFirst(null);
        // The advice for emergency answers must not depend on the network: show it anyway.
        if (route === 'emergency') {
          setEmergencyUnsent({ error, values });
          return;
        }
        applyServerFieldErrors(error, setError, [...DETAIL_FIELDS, 'redFlags']);
        if (isApiError(error) && DETAIL_FIELDS.some((f) => error.fields[f])) {
          setDetailsIncomplete(true);
          setStep(1);
        }
      },
    });
  }

  function onInvalid(invalid: FieldErrors<Input>) {
    setTriedToSend(true);
    if (DETAIL_FIELDS.some((f) => invalid[f])) {
      setDetailsIncomplete(true);
      setStep(1);
      return;
    }
    const flags = invalid.redFlags as Record<string, unknown> | undefined;
    const first = asked.find((i) => flags?.[i.id]);
    if (first) questionRefs.current.get(first.id)?.focus();
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    void handleSubmit(send, onInvalid)(event);
  }

  if (outcome) return <ReportOutcome outcome={outcome} homeHref={homeHref} />;

  if (emergencyFirst) return <EmergencyScreen emergencyNumber={emergencyNumber} delivery={emergencyFirst} homeHref={homeHref} />;

  if (kept) return <KeptOutcome urgent={kept.urgent} emergencyNumber={emergencyNumber} homeHref={homeHref} />;

  if (emergencyUnsent) {
    return (
      <EmergencyScreen
        emergencyNumber={emergencyNumber}
        sendError={create.error ?? emergencyUnsent.error}
        onRetry={() => send(emergencyUnsent.values)}
        retrying={create.isPending}
        homeHref={homeHref}
      />
    );
  }

  const missing = unansweredCount(errors, asked);

  const question = (item: RedFlagItem) => (
    <li key={item.id} className="rounded-lg border border-rule bg-sheet p-4">
      <Controller
        control={control}
        name={`redFlags.${item.id}`}
        render={({ field }) => (
          <YesNo
            question={item.question}
            value={field.value as boolean | undefined}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={(errors.redFlags as Record<string, unknown> | undefined)?.[item.id] ? UNANSWERED : undefined}
            groupRef={(el) => {
              if (el) questionRefs.current.set(item.id, el);
              else questionRefs.current.delete(item.id);
            }}
          />
        )}
      />
    </li>
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Report pain" className="space-y-6">
      <p className="text-sm text-muted">Step {step} of 2</p>
      {step === 1 ? (
        <>
          <h2 className="text-xl font-bold">Where, and how much</h2>
          <Controller
            control={control}
            name="bodyRegions"
            render={({ field }) => <BodyMap value={field.value ?? []} onChange={field.onChange} error={errors.bodyRegions?.message} />}
          />
          <ScoreField control={control} name="painNow" label="Pain now" low={PAIN_LOW} high={PAIN_HIGH} error={errors.painNow?.message} />
          <ScoreField
            control={control}
            name="painWorst24h"
            label="Worst pain in the last 24 hours"
            low={PAIN_LOW}
            high={PAIN_HIGH}
            error={errors.painWorst24h?.message}
          />
          <TextField
            label="When did it start?"
            type="date"
            large
            max={today}
            className="sm:w-56"
            error={errors.onsetDate?.message}
            {...register('onsetDate')}
          />
          <Controller
            control={control}
            name="aggravatingPatterns"
            render={({ field }) => (
              <CheckboxGroup
                legend="What makes it worse?"
                hint="Tick any movement that makes it hurt more. Leave them all blank if none do."
                name={field.name}
                options={PATTERN_OPTIONS}
                value={field.value ?? []}
                onChange={field.onChange}
                onBlur={field.onBlur}
                large
                error={errors.aggravatingPatterns?.message}
              />
            )}
          />
          <Controller
            control={control}
            name="startedInTraining"
            render={({ field }) => (
              <YesNo
                question="Did it start in training?"
                value={field.value}
                onChange={field.onChange}
                onBlur={field.onBlur}
                error={errors.startedInTraining ? UNANSWERED : undefined}
              />
            )}
          />
          <TextAreaField
            label="Anything else? (optional)"
            hint="For example what you were doing when it started. Your clinician reads this; your coach does not."
            large
            error={errors.note?.message}
            {...register('note', { setValueAs: emptyToUndefined })}
          />
          {detailsIncomplete && DETAIL_FIELDS.some((f) => errors[f]) && (
            <p
              role="alert"
              className="flex items-start gap-2 rounded-md border border-l-8 border-line-deep bg-sheet px-4 py-3 text-base font-semibold"
            >
              <span aria-hidden="true" className="text-line-deep">
                ▲
              </span>
              Some answers are missing: see the marked questions above.
            </p>
          )}
          <Button size="lg" onClick={() => void toWarningSigns()}>
            Next: warning signs
          </Button>
        </>
      ) : (
        <>
          <div>
            <h2 ref={stepHeading} tabIndex={-1} className="text-xl font-bold focus:outline-none">
              Warning signs
            </h2>
            <p className="mt-1 text-base text-ink-2">
              These questions look for rare but serious problems. Answer every one. A Yes does not mean something is wrong; it tells your
              care team to see you quickly.
            </p>
          </div>
          {triedToSend && missing > 0 && (
            <p
              role="alert"
              className="flex items-start gap-2 rounded-md border border-l-8 border-line-deep bg-sheet px-4 py-3 text-base font-semibold"
            >
              <span aria-hidden="true" className="text-line-deep">
                ▲
              </span>
              Answer every question before sending: {missing} still {missing === 1 ? 'needs' : 'need'} a Yes or No.
            </p>
          )}
          {backAsked && (
            <QuestionGroup title="About your back, hips and legs" hint="Asked because you marked your back or hip area.">
              {asked.filter((i) => i.scope === 'back_or_pelvis').map(question)}
            </QuestionGroup>
          )}
          <QuestionGroup title="About you and this pain" hint={backAsked ? 'Asked whatever the place.' : undefined}>
            {asked.filter((i) => i.scope === 'all').map(question)}
          </QuestionGroup>
          <ErrorNotice error={create.error} title="Your report was not sent" />
          <div className="flex flex-col gap-3 sm:flex-row-reverse sm:justify-end">
            <Button type="submit" size="lg" busy={create.isPending}>
              Send report
            </Button>
            <Button variant="secondary" size="lg" onClick={() => setStep(1)}>
              Back to where and how much
            </Button>
          </div>
        </>
      )}
    </form>
  );
}

/** One titled list of warning questions; the title names why these are asked. */
function QuestionGroup({ title, hint, children }: { title: string; hint?: string; children: ReactNode }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="space-y-3">
      <div>
        <h3 id={id} className="text-lg font-bold">
          {title}
        </h3>
        {hint && <p className="text-sm text-muted">{hint}</p>}
      </div>
      <ol className="space-y-5">{children}</ol>
    </section>
  );
}
