import { Controller, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { ExceptionCreateSchema, type ExceptionCreateInput } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, SelectField, TextAreaField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useRequestException } from '../api/exceptions';

export interface BreachingSet {
  setId: string;
  label: string;
  words: string;
}

/**
 * Asks the clinician to let chosen sets go past their cap, for one athlete, with a reason. Only the
 * clinician can grant it; the request and the decision are both on the audit trail.
 */
export function ExceptionRequestForm({
  orgId,
  sessionId,
  athletes,
  setsFor,
  onDone,
  onCancel,
}: {
  orgId: string;
  sessionId: string;
  athletes: { id: string; name: string }[];
  /** The athlete's sets that breach (unwaived), as choices. */
  setsFor: (athleteId: string) => BreachingSet[];
  onDone: () => void;
  onCancel: () => void;
}) {
  const request = useRequestException(orgId, sessionId);
  const first = athletes.find((a) => setsFor(a.id).length > 0) ?? athletes[0];
  const { control, register, handleSubmit, setValue, formState } = useForm<ExceptionCreateInput>({
    resolver: zodResolver(ExceptionCreateSchema),
    defaultValues: { athleteId: first?.id ?? '', setIds: setsFor(first?.id ?? '').map((s) => s.setId), reason: '' },
  });
  const athleteId = useWatch({ control, name: 'athleteId' });
  const choices = setsFor(athleteId);

  const onSubmit = handleSubmit((input) => request.mutate(input, { onSuccess: onDone }));

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Ask for an exception" className="space-y-3 rounded-lg border border-line bg-sheet p-3">
      <p className="text-sm text-ink-2">The clinician decides. Until they grant it, these sets keep the session from being published.</p>
      {athletes.length > 1 ? (
        <SelectField
          label="Athlete"
          {...register('athleteId', {
            onChange: (e: { target: { value: string } }) =>
              setValue(
                'setIds',
                setsFor(e.target.value).map((s) => s.setId),
              ),
          })}
          error={formState.errors.athleteId?.message}
        >
          {athletes.map((a) => (
            <option key={a.id} value={a.id}>
              {a.name}
            </option>
          ))}
        </SelectField>
      ) : (
        <p className="text-sm">
          For <span className="font-semibold">{athletes[0]?.name}</span>
        </p>
      )}
      {choices.length === 0 ? (
        <p className="text-sm text-ink-2">No set of this session goes past a cap for this athlete.</p>
      ) : (
        <Controller
          control={control}
          name="setIds"
          render={({ field }) => (
            <CheckboxGroup
              legend="Sets to ask about"
              name={field.name}
              options={choices.map((c) => ({ value: c.setId, label: c.label, hint: c.words }))}
              value={field.value}
              onChange={field.onChange}
              onBlur={field.onBlur}
              error={formState.errors.setIds?.message}
              className="[&_.flex-wrap]:flex-col"
            />
          )}
        />
      )}
      <TextAreaField
        label="Reason"
        hint="Say why this is safe to ask for, e.g. agreed with the clinician at today's review. The clinician reads it."
        error={formState.errors.reason?.message}
        {...register('reason')}
      />
      {request.isError && <ErrorNotice error={request.error} />}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={request.isPending} disabled={choices.length === 0}>
          Send the request
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
