import type { GroupPersonDto } from '../../../../../policies/dto/teams';

/** Someone who may be put in a group, as the pickers list them. */
export type Candidate = GroupPersonDto;

/** The group's current members first (so a member no longer offered can still be taken off), then the rest, by name. */
export function mergeCandidates(current: Candidate[], offered: Candidate[]): Candidate[] {
  const seen = new Set<string>();
  const out: Candidate[] = [];
  for (const c of [...current, ...offered]) {
    if (seen.has(c.id)) continue;
    seen.add(c.id);
    out.push(c);
  }
  return out.sort((a, b) => a.name.localeCompare(b.name));
}
