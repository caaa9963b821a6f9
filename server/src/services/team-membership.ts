import type { EntityManager } from 'typeorm';

/**
 * Called by the group commands, in their transaction, after a group's athletes changed: athletes who
 * joined get their own fitted versions of the group's team sessions, athletes who left lose the
 * versions not yet trained. Filled in by the team-program work (services/team-fit.ts).
 */
export async function onGroupAthletesChanged(
  _m: EntityManager,
  _change: { organizationId: string; groupId: string; added: string[]; removed: string[]; today: string },
): Promise<void> {}
