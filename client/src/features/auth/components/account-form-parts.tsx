import { isApiError } from '../../../lib/api-client';
import { TextField, type TextFieldProps } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';

/**
 * A refusal above an account form: too many tries is said in the limiter's own words, anything else as
 * usual. The network's limit (a school or club sharing one address) gets a title of its own, so nobody
 * reads it as a fault of their account.
 */
export function AccountFailureNotice({ error, limitedTitle }: { error: unknown; limitedTitle: string }) {
  if (!error) return null;
  if (isApiError(error) && (error.code === 'rate_limited' || error.code === 'rate_limited_network')) {
    return (
      <Notice tone="problem" role="alert" title={error.code === 'rate_limited_network' ? 'Paused for this network' : limitedTitle}>
        <p>{error.message}</p>
      </Notice>
    );
  }
  return <ErrorNotice error={error} />;
}

/** The address a person signs in with, marked up so that password managers fill it in. */
export function EmailField(props: Omit<TextFieldProps, 'label' | 'type' | 'autoComplete' | 'inputMode' | 'large'>) {
  return <TextField label="E-mail" type="email" autoComplete="username" inputMode="email" large {...props} />;
}

/** A password box on an account form; `autoComplete` tells password managers whether it is the current or a new one. */
export function PasswordField(props: Omit<TextFieldProps, 'type' | 'large'> & { autoComplete: 'current-password' | 'new-password' }) {
  return <TextField type="password" large {...props} />;
}
