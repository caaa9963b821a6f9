import type { EntityManager } from 'typeorm';
import { Program, ProgramSession } from '../entities';
import { fitOneVersion, removeVersions } from './team-fit';

/**
 * Called by the group commands, in their transaction, after a group's athletes changed: athletes who
 * joined get their own fitted versions of the group's team sessions from today on, athletes who left
 * lose the versions dated today or later that nothing was logged against (services/team-fit.ts).
 */
export async function onGroupAthletesChanged(
  m: EntityManager,
  change: { organizationId: string; groupId: string; added: string[]; removed: string[]; today: string },
): Promise<void> {
  await removeVersions(m, change.groupId, change.removed, change.today);
  if (change.added.length === 0) return;
  const programs = await m.find(Program, { where: { groupId: change.groupId, organizationId: change.organizationId } });
  for (const program of programs) {
    const sessions = await m
      .createQueryBuilder(ProgramSession, 's')
      .where('s.program_id = :p AND s.date >= :today', { p: program.id, today: change.today })
      .orderBy('s.date')
      .addOrderBy('s.created_at')
      .getMany();
    for (const team of sessions)
      for (const athleteId of [...new Set(change.added)].sort()) await fitOneVersion(m, team, program, athleteId, 'kg', change.today);
  }
}
