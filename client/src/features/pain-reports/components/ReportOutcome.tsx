import { useEffect, useRef, type ReactNode } from 'react';
import type { PainReportOutcomeDto } from '../../../../../policies/dto';
import { TIER_HEADINGS } from '../../../../../policies/red-flags';
import { Button, ButtonLink, buttonClass } from '../../../components/ui/Button';
import { describeError } from '../../../components/ui/Notice';
import { StatusMark } from '../../../components/ui/StatusMark';

/** The tiers' headings come from policies/red-flags.ts, so the outcome and the warning-signs box use the same words. */
export const EMERGENCY_HEADING = TIER_HEADINGS.emergency;
export const ROUTINE_HEADING = 'Your care team has your report';
export const URGENT_HEADING = TIER_HEADINGS.urgent;

/** tel: wants digits and a leading plus only. */
const telHref = (number: string) => `tel:${number.replace(/[^\d+]/g, '')}`;

function useFocusOnMount<T extends HTMLElement>() {
  const ref = useRef<T>(null);
  useEffect(() => {
    ref.current?.focus();
  }, []);
  return ref;
}

function CallButton({ number }: { number: string | null | undefined }) {
  if (!number) {
    return <p className="mt-5 rounded-lg border-2 border-ink bg-sheet p-4 text-xl font-bold">Call your local emergency number now.</p>;
  }
  return (
    <a href={telHref(number)} className={buttonClass('primary', 'lg', 'mt-5 min-h-16 w-full text-xl sm:w-full')}>
      <span aria-hidden="true">☎</span> Call {number}
    </a>
  );
}

/**
 * The emergency instruction, and nothing else, over the whole screen: it is the first thing seen and
 * focus starts on its heading. Shown from the server's answer, or — if the report could not be sent —
 * from the athlete's own answers, because the advice must not wait for the network.
 */
export function EmergencyScreen({
  emergencyNumber,
  statusSetToOut,
  message,
  sendError,
  onRetry,
  retrying,
  delivery,
  homeHref,
}: {
  emergencyNumber: string | null | undefined;
  statusSetToOut?: boolean;
  message?: string;
  /** Set when the report did not reach Loadline. */
  sendError?: unknown;
  onRetry?: () => void;
  retrying?: boolean;
  /** Shown from the athlete's answers before the server's: the report is on its way, or kept on the phone for later. */
  delivery?: 'sending' | 'kept';
  homeHref: string;
}) {
  const heading = useFocusOnMount<HTMLHeadingElement>();
  return (
    <div
      role="dialog"
      aria-modal="true"
      aria-labelledby="emergency-heading"
      className="fixed inset-0 z-50 overflow-y-auto border-t-8 border-line bg-paper"
    >
      <div className="mx-auto max-w-xl px-4 py-8">
        <h1 id="emergency-heading" ref={heading} tabIndex={-1} className="text-3xl leading-tight font-bold focus:outline-none">
          <span aria-hidden="true" className="mr-2 text-line-deep">
            ▲
          </span>
          {EMERGENCY_HEADING}
        </h1>
        <CallButton number={emergencyNumber} />
        <p className="mt-3 text-lg">
          Or go to the nearest emergency department. If you can&apos;t call, ask the nearest adult to call for you.
        </p>
        {sendError ? (
          <div role="alert" className="mt-5 rounded-md border border-l-8 border-line-deep bg-sheet px-4 py-3">
            <p className="font-semibold">Your report did not reach Loadline.</p>
            <p className="mt-1 text-ink-2">{describeError(sendError)}</p>
            <p className="mt-1">
              Your answers can be a sign of a serious problem. Get care first — don&apos;t wait for the app. Stop training, and tell your
              clinician and your coach yourself.
            </p>
            {onRetry && (
              <Button variant="secondary" className="mt-3" busy={retrying} onClick={onRetry}>
                Try sending the report again
              </Button>
            )}
          </div>
        ) : delivery === 'kept' ? (
          <div role="status" className="mt-5 rounded-md border border-l-8 border-line-deep bg-sheet px-4 py-3">
            <p className="font-semibold">Your report is kept on this phone.</p>
            <p className="mt-1">
              Loadline can&apos;t be reached right now; the report is sent as soon as it can be. Don&apos;t wait for it: get care first,
              stop training, and tell your clinician and your coach yourself.
            </p>
          </div>
        ) : delivery === 'sending' ? (
          <p role="status" className="mt-5 text-base text-ink-2">
            Sending your report to your care team…
          </p>
        ) : (
          <>
            {message && <p className="mt-5 text-base">{message}</p>}
            {statusSetToOut && (
              <div className="mt-4 rounded-md border border-rule bg-sheet px-4 py-3">
                <p className="text-sm text-ink-2">You are now set to</p>
                <StatusMark status="out" size="lg" explain />
              </div>
            )}
          </>
        )}
        <p className="mt-8">
          <ButtonLink to={homeHref} variant="secondary">
            I have read this — back to my page
          </ButtonLink>
        </p>
      </div>
    </div>
  );
}

function OutcomeFrame({ heading, children, homeHref }: { heading: string; children: ReactNode; homeHref: string }) {
  const ref = useFocusOnMount<HTMLHeadingElement>();
  return (
    <section aria-labelledby="outcome-heading" className="space-y-4">
      <h1 id="outcome-heading" ref={ref} tabIndex={-1} className="text-2xl font-bold tracking-tight focus:outline-none">
        {heading}
      </h1>
      {children}
      <p>
        <ButtonLink to={homeHref} variant="primary" size="lg">
          Back to my page
        </ButtonLink>
      </p>
    </section>
  );
}

function WarningLine({ emergencyNumber }: { emergencyNumber: string }) {
  return (
    <p className="rounded-md border-2 border-line-deep bg-sheet px-4 py-3 text-sm">
      <span aria-hidden="true" className="mr-1 text-line-deep">
        ▲
      </span>
      If a warning sign appears — new numbness between the legs, trouble peeing or pooing, a leg getting weaker — stop and get urgent care:
      call{' '}
      <a href={telHref(emergencyNumber)} className="font-semibold tabular-nums">
        {emergencyNumber}
      </a>
      .
    </p>
  );
}

/**
 * A report kept on the phone (no signal), not emergency: what happens next, and for warning signs
 * that need a clinician today, to call them without waiting for the app.
 */
export function KeptOutcome({
  urgent,
  emergencyNumber,
  homeHref,
}: {
  urgent: boolean;
  emergencyNumber: string | null | undefined;
  homeHref: string;
}) {
  return (
    <OutcomeFrame heading="Your report is saved on this phone" homeHref={homeHref}>
      <p className="text-base">
        Loadline can&apos;t be reached right now. Your report is sent to your care team as soon as it can be; your page shows it until then.
      </p>
      {urgent && (
        <p className="rounded-md border border-l-8 border-line bg-sheet px-4 py-3 text-base">
          {URGENT_HEADING}. Some of your answers need your clinician today: call or message them yourself, don&apos;t wait for the app.
        </p>
      )}
      {emergencyNumber && <WarningLine emergencyNumber={emergencyNumber} />}
    </OutcomeFrame>
  );
}

/** What the athlete reads after sending a report, by the route the server chose. */
export function ReportOutcome({ outcome, homeHref }: { outcome: PainReportOutcomeDto; homeHref: string }) {
  if (outcome.route === 'emergency') {
    return (
      <EmergencyScreen
        emergencyNumber={outcome.emergencyNumber}
        statusSetToOut={outcome.statusSetToOut}
        message={outcome.message}
        homeHref={homeHref}
      />
    );
  }
  if (outcome.route === 'urgent') {
    return (
      <OutcomeFrame heading={URGENT_HEADING} homeHref={homeHref}>
        <p className="rounded-md border border-l-8 border-line bg-sheet px-4 py-3 text-base">{outcome.message}</p>
        <p className="text-base">
          Your clinician has your report and your answers. Call or message them today if they have not been in touch.
        </p>
        <WarningLine emergencyNumber={outcome.emergencyNumber} />
      </OutcomeFrame>
    );
  }
  return (
    <OutcomeFrame heading={ROUTINE_HEADING} homeHref={homeHref}>
      <p className="text-base">{outcome.message}</p>
      <div className="rounded-lg border border-rule bg-sheet p-4">
        <h2 className="text-lg font-bold">What happens next</h2>
        <ol className="mt-2 list-decimal space-y-1 pl-5 text-base">
          <li>Your clinician reads your report and may get in touch.</li>
          <li>They may change what you can do for a while; your page will show it.</li>
          <li>Until then, follow the limits on your page. If the pain gets worse, tell your clinician.</li>
        </ol>
      </div>
      <WarningLine emergencyNumber={outcome.emergencyNumber} />
    </OutcomeFrame>
  );
}
