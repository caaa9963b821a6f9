import { useId } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import type { LetterCheckDto } from '../../../../../policies/dto';
import { CheckCodeSchema } from '../../../../../policies/schemas';
import { describeDate } from '../../../../../policies/load/describe';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Facts, Loading } from '../../../components/ui/Panel';
import { useLetterCheck } from '../api/check-letter';
import { Seal, type SealShape } from './LetterMarks';

type CodeInput = z.input<typeof CheckCodeSchema>;

/**
 * The public check: a code in, a plain answer out. `code` comes from the address (/check/:code),
 * so a link or a scanned QR code checks at once; the form sends the person to that address.
 */
export function CheckLetter({ code, onCheck }: { code: string | null; onCheck: (code: string) => void }) {
  const parsed = code === null ? null : CheckCodeSchema.safeParse({ code });
  const valid = parsed?.success ? parsed.data.code : null;
  const check = useLetterCheck(valid);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<CodeInput>({
    resolver: zodResolver(CheckCodeSchema),
    defaultValues: { code: code ?? '' },
  });
  // A code from the address that cannot be right is explained on the field straight away, unsent.
  const addressError = parsed && !parsed.success ? parsed.error.issues[0]?.message : undefined;

  const onSubmit = handleSubmit((values) => {
    if (values.code === valid) void check.refetch();
    else onCheck(values.code);
  });

  return (
    <div className="space-y-6">
      <form onSubmit={onSubmit} noValidate aria-label="Letter check" className="space-y-3">
        <TextField
          label="Verification code"
          hint="Printed on the letter, under the QR code: 20 letters and digits in groups of four."
          autoComplete="off"
          autoCapitalize="characters"
          spellCheck={false}
          large
          className="[&_input]:font-mono"
          error={errors.code?.message ?? addressError}
          {...register('code')}
        />
        <Button type="submit" size="lg" busy={check.isFetching}>
          Check
        </Button>
      </form>
      <div aria-live="polite">
        {valid !== null &&
          (check.isPending ? (
            <Loading what="the answer" />
          ) : check.isError ? (
            <ErrorNotice error={check.error} />
          ) : (
            <CheckResult result={check.data} />
          ))}
      </div>
    </div>
  );
}

const ANSWERS: Record<LetterCheckDto['status'], { heading: string; shape: SealShape; text: (r: LetterCheckDto) => string }> = {
  valid: {
    heading: 'Valid',
    shape: 'signed',
    text: () => 'This letter was signed by the athlete’s clinician and is the one in force now.',
  },
  scheduled: {
    heading: 'Not yet in force',
    shape: 'scheduled',
    text: (r) =>
      `Signed, takes effect on ${r.effectiveFrom ? describeDate(r.effectiveFrom) : 'its start date'}. The letter is genuine; until that date the athlete’s earlier letter, if there is one, stays in force.`,
  },
  expired: {
    heading: 'Expired',
    shape: 'expired',
    text: (r) =>
      `This letter was valid until ${r.validUntil ? describeDate(r.validUntil) : 'its review date'}. Ask the athlete’s clinician for a current letter.`,
  },
  superseded: {
    heading: 'Superseded',
    shape: 'superseded',
    text: () => 'This letter was genuine, but a later letter has replaced it. Ask for the latest letter.',
  },
  unknown: {
    heading: 'Not found',
    shape: 'unknown',
    text: () => 'No signed letter has this code. Check it for typing mistakes; a letter that was never signed has no code.',
  },
};

/** The answer in big plain words with a shape, and only initials, decision, dates and organization. */
export function CheckResult({ result }: { result: LetterCheckDto }) {
  const headingId = useId();
  const answer = ANSWERS[result.status];
  return (
    <section aria-labelledby={headingId} className="rounded-lg border-2 border-ink bg-sheet p-4 sm:p-5">
      <div className="flex items-center gap-3">
        <span className={result.status === 'valid' ? 'text-ink' : 'text-ink-2'}>
          <Seal shape={answer.shape} size={44} />
        </span>
        <h2 id={headingId} className="text-4xl font-bold tracking-tight">
          {answer.heading}
        </h2>
      </div>
      <p className="mt-3 text-base">{answer.text(result)}</p>
      {result.newerDecision && (
        <p className="mt-3 rounded-md border border-l-8 border-line px-4 py-3 text-base font-semibold">
          A newer decision exists: the clinician has changed this decision since the letter was signed. Ask{' '}
          {result.organizationName ?? 'the issuing organization'} for the updated letter.
        </p>
      )}
      {result.status !== 'unknown' && (
        <div className="mt-4">
          <Facts
            items={[
              { label: 'Athlete', value: result.athleteInitials ?? '—' },
              { label: 'Decision', value: result.decision ?? '—' },
              { label: 'From', value: result.effectiveFrom ? describeDate(result.effectiveFrom) : '—' },
              { label: 'Valid until', value: result.validUntil ? describeDate(result.validUntil) : 'no end date' },
              { label: 'Issued on', value: result.issuedOn ? describeDate(result.issuedOn) : '—' },
              { label: 'Issued by', value: result.organizationName ?? '—' },
            ]}
          />
        </div>
      )}
    </section>
  );
}
