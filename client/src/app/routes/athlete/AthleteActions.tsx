import { ButtonLink } from '../../../components/ui/Button';
import { NextMorningPrompt } from '../../../features/training-logs/components/NextMorningPrompt';
import { ATHLETE_CHECK_IN, ATHLETE_CLIPS, ATHLETE_DOCUMENTS, ATHLETE_LOG, ATHLETE_REPORT, ATHLETE_WEEK } from './paths';

/**
 * The athlete's four doors, large and first on the page, then the next-morning question when a
 * recent session is waiting for it. Reporting pain comes first: it is the one that can't wait.
 */
export function AthleteActions({ orgId, athleteId }: { orgId: string; athleteId: string }) {
  return (
    <>
      <nav aria-label="Report and log" className="grid grid-cols-2 gap-2">
        <ButtonLink to={ATHLETE_REPORT} variant="primary" size="lg" className="col-span-2 min-h-14 text-lg sm:w-full">
          Report pain
        </ButtonLink>
        <ButtonLink to={ATHLETE_CHECK_IN} size="lg" className="min-h-14 sm:w-full">
          Check in
        </ButtonLink>
        <ButtonLink to={ATHLETE_LOG} size="lg" className="min-h-14 sm:w-full">
          Log a session
        </ButtonLink>
        <ButtonLink to={ATHLETE_WEEK} size="lg" className="col-span-2 min-h-14 sm:w-full">
          My week
        </ButtonLink>
        <ButtonLink to={ATHLETE_CLIPS} size="lg" className="min-h-12 sm:w-full">
          My clips
        </ButtonLink>
        <ButtonLink to={ATHLETE_DOCUMENTS} size="lg" className="min-h-12 sm:w-full">
          My documents
        </ButtonLink>
      </nav>
      <NextMorningPrompt orgId={orgId} athleteId={athleteId} />
    </>
  );
}
