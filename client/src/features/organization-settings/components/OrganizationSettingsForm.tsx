import { useEffect, useMemo } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { OrganizationSettingsDto } from '../../../../../policies/dto';
import { LETTER_PAPERS, PAPER_LABELS, letterPaperOf } from '../../../../../policies/letter-paper';
import { OrganizationSettingsSchema } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { SelectField, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { queryKeys } from '../../../lib/query-keys';
import { useUpdateOrganizationSettings } from '../api/organization-settings';
import { countryChoices, emergencyNumberHint, numberForCountryChange } from './countries';
import { timeZoneChoices, timeZoneLabel } from './time-zones';

type Input = z.input<typeof OrganizationSettingsSchema>;
type Output = z.output<typeof OrganizationSettingsSchema>;

const startingValues = (s: OrganizationSettingsDto): Input => ({
  name: s.name,
  emergencyNumber: s.emergencyNumber,
  guardiansSeeClips: s.guardiansSeeClips,
  timeZone: s.timeZone,
  letterPaper: s.letterPaper,
  country: s.country ?? undefined,
  version: s.version,
});

/** Name, country and local emergency number, time zone, letter paper and who watches clips; saved with the version it was read at. */
export function OrganizationSettingsForm({ orgId, settings }: { orgId: string; settings: OrganizationSettingsDto }) {
  const queryClient = useQueryClient();
  const update = useUpdateOrganizationSettings(orgId);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    control,
    getValues,
    setValue,
    formState: { errors, isDirty },
  } = useForm<Input, unknown, Output>({ resolver: zodResolver(OrganizationSettingsSchema), defaultValues: startingValues(settings) });

  useEffect(() => {
    reset(startingValues(settings));
  }, [settings, reset]);

  const countries = useMemo(() => countryChoices(), []);
  const [country, emergencyNumber, timeZone, letterPaper] = useWatch({
    control,
    name: ['country', 'emergencyNumber', 'timeZone', 'letterPaper'],
  });
  // The paper letters will print on once saved, as the server works it out (policies/letter-paper.ts).
  const paperInUse = letterPaperOf({ letterPaper: letterPaper ?? null, country: country ?? null, timeZone: timeZone ?? settings.timeZone });
  const numberHint = emergencyNumberHint(settings, { country, emergencyNumber: emergencyNumber ?? '' });
  const zones = useMemo(() => timeZoneChoices(settings.timeZone), [settings.timeZone]);
  const stale = isApiError(update.error) && (update.error.code === 'version_conflict' || update.error.status === 409);
  const onSubmit = handleSubmit((values) =>
    update.mutate(values, {
      onError: (error) =>
        applyServerFieldErrors(error, setError, ['name', 'country', 'emergencyNumber', 'timeZone', 'guardiansSeeClips', 'letterPaper']),
    }),
  );

  async function reload() {
    await queryClient.invalidateQueries({ queryKey: queryKeys.organizationSettings(orgId) });
    update.reset();
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Organization settings" className="max-w-xl space-y-4">
      {stale ? (
        <Notice tone="problem" role="alert" title="Not saved: someone else changed these settings">
          <p>Another admin saved these settings after you opened this page. Reload to see their version, then make your change again.</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void reload()}>
            Reload the settings
          </Button>
        </Notice>
      ) : (
        <ErrorNotice error={update.error} title="Not saved" />
      )}
      {update.isSuccess && !isDirty && (
        <Notice tone="done" role="status">
          <p>Settings saved.</p>
        </Notice>
      )}
      <TextField label="Organization name" error={errors.name?.message} {...register('name')} />
      <SelectField
        label="Country"
        hint="Brings its emergency number, unless the number below was set by hand."
        error={errors.country?.message}
        {...register('country', {
          setValueAs: (v: string | undefined) => (v ? v : undefined),
          onChange: (e: { target: { value: string } }) => {
            const to = e.target.value || undefined;
            // `country` is still this render's value: the one the select showed before this change.
            const number = numberForCountryChange(settings, getValues('emergencyNumber') ?? '', country, to);
            if (number !== getValues('emergencyNumber')) setValue('emergencyNumber', number, { shouldDirty: true });
          },
        })}
      >
        {!settings.country && <option value="">Not recorded: choose the country</option>}
        {countries.map((c) => (
          <option key={c.code} value={c.code}>
            {c.name}
          </option>
        ))}
      </SelectField>
      <TextField
        label="Local emergency number"
        hint={numberHint}
        inputMode="tel"
        error={errors.emergencyNumber?.message}
        {...register('emergencyNumber')}
      />
      <SelectField
        label="Time zone"
        hint="Sets which day counts as today for everyone here: the day a session is logged for, the day a status starts, this morning and this week. Times stay on each person's own clock."
        error={errors.timeZone?.message}
        {...register('timeZone')}
      >
        {zones.map((zone) => (
          <option key={zone} value={zone}>
            {timeZoneLabel(zone)}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Paper for clearance letters"
        hint={`By country: the paper of the organization's country (US Letter in the United States, Canada, Mexico, the Philippines and parts of Latin America; A4 elsewhere). Letters ${isDirty ? `will print on ${PAPER_LABELS[paperInUse]} once saved` : `print on ${PAPER_LABELS[paperInUse]} now`}. Letters already signed keep their paper.`}
        error={errors.letterPaper?.message}
        {...register('letterPaper', { setValueAs: (v: string | null) => (v ? v : null) })}
      >
        <option value="">By country</option>
        {LETTER_PAPERS.map((paper) => (
          <option key={paper} value={paper}>
            {PAPER_LABELS[paper]}
          </option>
        ))}
      </SelectField>
      <fieldset className="rounded-md border border-rule p-3">
        <legend className="px-1 text-sm font-semibold">Technique clips</legend>
        <div className="flex items-start gap-2">
          <input
            id="guardians-see-clips"
            type="checkbox"
            className="mt-0.5 size-5 shrink-0 accent-ink"
            {...register('guardiansSeeClips')}
          />
          <label htmlFor="guardians-see-clips" className="text-sm">
            Guardians may watch their athlete&apos;s clips
            <span className="block text-muted">
              With the notes the coach and clinician pinned to them. Off: only the athlete, the coaches and the clinicians on the care team
              see clips.
            </span>
          </label>
        </div>
      </fieldset>
      <Button type="submit" busy={update.isPending} disabled={!isDirty}>
        Save settings
      </Button>
    </form>
  );
}
