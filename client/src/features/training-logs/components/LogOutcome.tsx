import { useEffect, useRef } from 'react';
import type { TrainingLogOutcomeDto } from '../../../../../policies/dto';
import { formatDate } from '../../../lib/format';
import { Button, ButtonLink } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { LineBar } from '../../../components/ui/LineBar';
import { PainRuleMessage } from './PainRuleMessage';
import { effortWords } from './effort-words';

/** After saving: the pain rule's answer first, then the session in numbers against the line. */
export function LogOutcome({
  outcome,
  onAnother,
  weekHref,
  homeHref,
}: {
  outcome: TrainingLogOutcomeDto;
  onAnother: () => void;
  weekHref: string;
  homeHref: string;
}) {
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => heading.current?.focus(), []);
  const { log, painRule } = outcome;
  return (
    <section aria-labelledby="log-saved" className="space-y-4">
      <h2 id="log-saved" ref={heading} tabIndex={-1} className="text-xl font-bold focus:outline-none">
        Session saved
      </h2>
      <PainRuleMessage painRule={painRule} />
      {outcome.overLimits?.length > 0 && (
        <Notice tone="caution" title="Some sets were over your limits for that day">
          <p>They are saved as you did them. Your clinician and coach have been told, so they can talk it through with you:</p>
          <ul className="mt-1 ml-5 list-disc">
            {outcome.overLimits.map((o) => (
              <li key={o}>{o}</li>
            ))}
          </ul>
        </Notice>
      )}
      <div className="space-y-3 rounded-lg border border-rule bg-sheet p-4">
        <p className="text-sm text-ink-2 tabular-nums">
          {formatDate(log.date)} · {log.durationMinutes} min · effort {log.sessionRpe} ({effortWords(log.sessionRpe).toLowerCase()}) ·
          session load {log.sessionLoad} (effort × minutes)
        </p>
        <LineBar
          label="Pain during (0–10), against your clinician's ceiling"
          value={log.painDuring}
          limit={log.painCeiling}
          max={10}
          format={String}
        />
        {log.painAfter !== null && (
          <LineBar
            label="Pain after the session (0–10), against the same ceiling"
            value={log.painAfter}
            limit={log.painCeiling}
            max={10}
            format={String}
          />
        )}
        <p className="text-sm text-ink-2">
          {log.painAfter === null
            ? 'This evening your page will ask how the pain is after the session, and tomorrow morning again.'
            : 'Tomorrow morning, your page will ask how the pain is.'}
        </p>
      </div>
      <div className="flex flex-col gap-3 sm:flex-row">
        <ButtonLink to={homeHref} variant="primary" size="lg">
          Back to my page
        </ButtonLink>
        <ButtonLink to={weekHref} size="lg">
          My week
        </ButtonLink>
        <Button variant="secondary" size="lg" onClick={onAnother}>
          Log another session
        </Button>
      </div>
    </section>
  );
}
