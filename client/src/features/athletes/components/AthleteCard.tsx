import { useId } from 'react';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import { ROLE_LABELS } from '../../../../../policies/roles';
import { formatDate } from '../../../lib/format';
import { Facts } from '../../../components/ui/Panel';

/**
 * One athlete, in a single column with room to breathe, for the athlete's own page and a guardian's.
 * `self` words it to the athlete ("your care team").
 */
export function AthleteCard({ athlete, self = false }: { athlete: AthleteProfileDto; self?: boolean }) {
  const id = useId();
  const coaches = athlete.careTeam.filter((m) => m.role === 'coach');
  const clinicians = athlete.careTeam.filter((m) => m.role === 'clinician');
  return (
    <section aria-labelledby={id} className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <h2 id={id} className="text-xl font-bold">
        {athlete.displayName}
      </h2>
      <div className="mt-3">
        <Facts
          items={[
            { label: 'Sport', value: athlete.sport ?? 'Not recorded' },
            ...(athlete.position ? [{ label: 'Position', value: athlete.position }] : []),
            { label: 'Age', value: athlete.age ?? 'Not recorded' },
            { label: 'Date of birth', value: formatDate(athlete.dateOfBirth) },
          ]}
        />
      </div>

      <h3 className="mt-5 text-base font-bold">{self ? 'Your care team' : 'Care team'}</h3>
      {athlete.careTeam.length === 0 ? (
        <p className="mt-1 text-sm text-ink-2">
          No coach or clinician is assigned yet. The organization&apos;s administrator sets up the care team.
        </p>
      ) : (
        <ul className="mt-2 space-y-2">
          {[...clinicians, ...coaches].map((member) => (
            <li
              key={member.id}
              className="flex min-h-12 flex-wrap items-center justify-between gap-x-3 gap-y-1 rounded-md border border-rule px-3 py-2"
            >
              <span className="font-semibold">{member.memberName}</span>
              <span className="text-sm text-ink-2">{ROLE_LABELS[member.role]}</span>
              {/* "Contact your clinician" has to be something a person can do from here. */}
              <a href={`mailto:${member.memberEmail}`} className="w-full break-all text-sm underline underline-offset-2">
                <span className="sr-only">E-mail {member.memberName}: </span>
                {member.memberEmail}
              </a>
            </li>
          ))}
        </ul>
      )}

      <h3 className="mt-5 text-base font-bold">{self ? 'Your guardians' : 'Guardians'}</h3>
      {athlete.guardians.length === 0 ? (
        <p className="mt-1 text-sm text-ink-2">
          {athlete.isMinor
            ? 'No guardian is linked yet. The administrator links a parent or guardian for athletes under 18.'
            : 'No guardian is linked.'}
        </p>
      ) : (
        <ul className="mt-2 space-y-2">
          {athlete.guardians.map((link) => (
            <li key={link.id} className="flex min-h-12 items-center rounded-md border border-rule px-3 py-2 font-semibold">
              {link.guardianName}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
