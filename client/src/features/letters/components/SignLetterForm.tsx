import { useId } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { LetterSignSchema } from '../../../../../policies/schemas';
import type { LetterDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useSignLetter, type LetterSignInput } from '../api/sign-letter';
import { dayOf } from './letter-words';

/**
 * Signing with a typed full name. What signing does is said before the field, in full: the letter
 * freezes and goes out by e-mail; the letter in force is superseded from this one's start date.
 */
export function SignLetterForm({
  orgId,
  letterId,
  version,
  signerName,
  unsaved,
  replaces,
  onSigned,
  onStale,
}: {
  orgId: string;
  letterId: string;
  /** The version of the draft on screen: a draft changed elsewhere is refused, not signed unseen. */
  version: number;
  signerName: string;
  /** Edits on screen that are not saved yet: signing would sign the saved draft, so it waits. */
  unsaved: boolean;
  /** The letter in force now, which this one will supersede. */
  replaces: LetterDto | null;
  onSigned: (signed: LetterDto) => void;
  onStale: () => void;
}) {
  const id = useId();
  const sign = useSignLetter(orgId, letterId);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<LetterSignInput>({ resolver: zodResolver(LetterSignSchema), defaultValues: { signature: '', version } });
  // Changed elsewhere, or signed by someone else meanwhile: say so and offer the latest, never a blind retry.
  const stale =
    isApiError(sign.error) && (sign.error.code === 'version_conflict' || sign.error.code === 'conflict') ? sign.error.message : null;

  const onSubmit = handleSubmit((values) => sign.mutate({ ...values, version }, { onSuccess: onSigned }));

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Sign and send the letter" className="space-y-3">
      <div id={`${id}-what`} className="rounded-md border border-ink bg-paper px-3 py-2 text-sm">
        <p className="font-semibold">Signing freezes this letter and sends it.</p>
        <p className="mt-1 text-ink-2">
          Once signed, the letter cannot be changed. Loadline makes the PDF with its verification code and e-mails it to the athlete’s
          guardian(s), the athlete and the coach(es) on the care team.
          {replaces?.signedAt &&
            ` It supersedes the letter signed on ${dayOf(replaces.signedAt)} from this letter’s start date; until then that letter stays in force.`}
        </p>
      </div>
      {stale ? (
        <Notice tone="problem" role="alert" title="Not signed">
          <p>{stale}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={onStale}>
            Load the latest draft
          </Button>
        </Notice>
      ) : (
        <ErrorNotice error={sign.error} />
      )}
      {unsaved && (
        <Notice tone="caution" className="max-w-prose">
          <p id={`${id}-unsaved`}>You have changes above that are not saved. Save them first: signing signs the saved draft.</p>
        </Notice>
      )}
      <TextField
        label="Type your full name to sign"
        hint={`Your typed name is your signature, dated and kept in the audit trail. You are signed in as ${signerName}.`}
        autoComplete="name"
        className="sm:max-w-md"
        error={errors.signature ? 'Type your full name: the letter cannot be signed without it.' : undefined}
        {...register('signature')}
      />
      <Button type="submit" busy={sign.isPending} disabled={unsaved} aria-describedby={unsaved ? `${id}-unsaved` : `${id}-what`}>
        Sign and send
      </Button>
    </form>
  );
}
