import type { EntityManager } from 'typeorm';
import { emergencyNumberFor } from '../../../policies/emergency-numbers';
import { Organization } from '../entities';
import type { AuditFn } from '../core/tx';
import { seedExerciseLibrary } from './exercise-library';

export interface NewOrganization {
  name: string;
  country: string | null;
  timeZone: string;
}

/**
 * Creates an organization with its own copy of the exercise library. Its first audit entry,
 * `organization.created`, starts the organization's own hash chain (services/audit.ts chains per
 * organization), so everything later in it links back to its creation. `via` says who made it: its
 * first admin from the public page, or an operator on the command line.
 */
export async function startOrganization(
  m: EntityManager,
  audit: AuditFn,
  input: NewOrganization,
  by: { via: 'signup' | 'operator'; actorUserId: string | null },
): Promise<Organization> {
  const org = await m.save(
    m.create(Organization, {
      name: input.name,
      country: input.country,
      timeZone: input.timeZone,
      emergencyNumber: emergencyNumberFor(input.country ?? ''),
    }),
  );
  await seedExerciseLibrary(m, org.id);
  await audit({
    organizationId: org.id,
    actorUserId: by.actorUserId,
    action: 'organization.created',
    subjectType: 'Organization',
    subjectId: org.id,
    after: { name: org.name, country: org.country, timeZone: org.timeZone, emergencyNumber: org.emergencyNumber, via: by.via },
  });
  return org;
}
