import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { isCountryCode } from '../../../../../policies/countries';
import { OrganizationSignupSchema } from '../../../../../policies/schemas';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { Button } from '../../../components/ui/Button';
import { SelectField, TextField } from '../../../components/ui/Field';
import { Notice } from '../../../components/ui/Notice';
import { AccountFailureNotice, EmailField, PasswordField } from '../../auth/components/account-form-parts';
import { countryChoices } from '../../organization-settings/components/countries';
import { timeZoneChoices, timeZoneLabel } from '../../organization-settings/components/time-zones';
import { useRequestSignup } from '../api/org-signup';

type Input = z.input<typeof OrganizationSignupSchema>;
type Output = z.output<typeof OrganizationSignupSchema>;

/** The browser's own zone and country, as a first guess the person can change. */
function browserGuess(): { timeZone: string; country: string } {
  let timeZone = 'UTC';
  let country = '';
  try {
    timeZone = Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
    const region = new Intl.Locale(navigator.language).maximize().region ?? '';
    country = isCountryCode(region) ? region : '';
  } catch {
    // An old browser: the person picks both.
  }
  return { timeZone, country };
}

/** The public form that starts an organization; its first admin confirms the address by e-mail. */
export function StartOrganizationForm() {
  const request = useRequestSignup();
  const guess = useMemo(() => browserGuess(), []);
  const zones = useMemo(() => timeZoneChoices(guess.timeZone), [guess.timeZone]);
  const countries = useMemo(() => countryChoices(), []);
  const {
    register,
    handleSubmit,
    getValues,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(OrganizationSignupSchema),
    defaultValues: { organizationName: '', country: guess.country, timeZone: guess.timeZone, adminName: '', email: '', password: '' },
  });

  if (request.isSuccess) {
    return (
      <Notice tone="done" role="status" title="Check your e-mail">
        <p>{request.data.message}</p>
        <p>
          Nothing is created until the address is confirmed. If no e-mail arrives within a few minutes, check the address you entered (
          {getValues('email')}) and start again.
        </p>
      </Notice>
    );
  }

  const onSubmit = handleSubmit((values) =>
    request.mutate(values, {
      onError: (error) =>
        applyServerFieldErrors(error, setError, ['organizationName', 'country', 'timeZone', 'adminName', 'email', 'password']),
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Start an organization">
      <AccountFailureNotice error={request.error} limitedTitle="Too many requests" />
      <fieldset className="space-y-4">
        <legend className="text-lg font-semibold">The organization</legend>
        <TextField
          label="Organization name"
          hint="As your athletes and their families know it: a school, club or clinic."
          autoComplete="organization"
          large
          error={errors.organizationName?.message}
          {...register('organizationName')}
        />
        <SelectField label="Country" large error={errors.country?.message} {...register('country')}>
          <option value="">Choose a country</option>
          {countries.map((c) => (
            <option key={c.code} value={c.code}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Time zone"
          hint="Its calendar day is everyone's “today” in the organization."
          large
          error={errors.timeZone?.message}
          {...register('timeZone')}
        >
          {zones.map((zone) => (
            <option key={zone} value={zone}>
              {timeZoneLabel(zone)}
            </option>
          ))}
        </SelectField>
      </fieldset>
      <fieldset className="space-y-4">
        <legend className="text-lg font-semibold">You, its first administrator</legend>
        <TextField label="Your name" autoComplete="name" large error={errors.adminName?.message} {...register('adminName')} />
        <EmailField
          hint="We send a link to this address; the organization starts when you open it."
          error={errors.email?.message}
          {...register('email')}
        />
        <PasswordField
          label="Password"
          hint="At least 8 characters; a longer phrase of 15 or more is better. If this address already has a Loadline account, its password stays the one you use."
          autoComplete="new-password"
          error={errors.password?.message}
          {...register('password')}
        />
      </fieldset>
      <Button type="submit" size="lg" busy={request.isPending}>
        Start the organization
      </Button>
    </form>
  );
}
