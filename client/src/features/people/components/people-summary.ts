import type { PersonDto } from '../../../../../policies/dto';
import { ROLE_LABELS } from '../../../../../policies/roles';

/** One line describing where a person sits around athletes: their care team, or the teams they are on. */
export function careTeamSummary(person: PersonDto, everyone: PersonDto[]): string {
  const parts: string[] = [];
  if (person.athlete) {
    const team = person.athlete.careTeam.map((a) => `${a.memberName} (${ROLE_LABELS[a.role].toLowerCase()})`);
    parts.push(team.length > 0 ? team.join(', ') : 'No care team yet');
    const guardians = person.athlete.guardians.map((g) => g.guardianName);
    if (guardians.length > 0) parts.push(`Guardian: ${guardians.join(', ')}`);
  }
  const teams = everyone.filter((other) => other.athlete?.careTeam.some((a) => a.memberId === person.id)).length;
  if (teams > 0) parts.push(`On ${teams} care ${teams === 1 ? 'team' : 'teams'}`);
  const wards = everyone.filter((other) => other.athlete?.guardians.some((g) => g.guardianId === person.id)).length;
  if (wards > 0) parts.push(`Guardian of ${wards} ${wards === 1 ? 'athlete' : 'athletes'}`);
  return parts.length > 0 ? parts.join(' · ') : '—';
}

export function rolesText(person: PersonDto): string {
  return person.roles.map((r) => ROLE_LABELS[r]).join(', ');
}
