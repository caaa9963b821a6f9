import type { EntityManager } from 'typeorm';
import type { CareTeamAssignmentDto, GuardianLinkDto } from '../../../policies/dto';
import type { CareTeamAssignmentCreateInput, GuardianLinkCreateInput } from '../../../policies/schemas';
import type { Role } from '../../../policies/roles';
import { CareTeamAssignment, GuardianLink } from '../entities';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { isUniqueViolation, requireMemberWithRole } from '../services/org-members';
import { careTeamsFor, guardianLinksFor } from '../queries/athlete-links';

/**
 * The links between an athlete and the people around them — a coach or clinician on the care team,
 * a guardian — are one kind of write: both ends must be active members of this organization holding
 * the link's role, a link exists once, and adding or removing one is audited with the athlete named.
 * Access follows at once: the rules read the links afresh on every request (ASVS 5.0 V8.3.2).
 *
 * A care-team change also changes who must be told about the athlete's held sessions (each coach on
 * the team), so it goes through the one "limits changed" path (commands/limits.ts).
 */
interface LinkSpec<Input extends { athleteId: string }, Row extends CareTeamAssignment | GuardianLink, Dto extends { id: string }> {
  subject: 'CareTeamAssignment' | 'GuardianLink';
  entity: new () => Row;
  /** The audit actions of adding and removing a link. */
  linked: string;
  unlinked: string;
  /** The member at the other end of a new link, the role they must hold and the form field naming them. */
  member(input: Input): { id: string; role: Role; field: string };
  /** The role the member of an existing link holds it in. */
  roleOf(row: Row): Role;
  duplicate(input: Input): string;
  /** What the removal's audit entry records of the link. */
  describe(row: Row): Record<string, unknown>;
  read(m: EntityManager, athleteId: string): Promise<Dto[]>;
  /** The change must be reported to the limits path (`changed` does it). */
  changesLimits: boolean;
  /** Reported after the change, in its transaction. */
  changed(ctx: OrgCommandCtx, athleteId: string, role: Role, how: 'joined' | 'left'): Promise<void>;
}

function linkCommand<I extends { athleteId: string }, R extends CareTeamAssignment | GuardianLink, D extends { id: string }>(
  name: string,
  spec: LinkSpec<I, R, D>,
) {
  return orgCommand({
    name,
    changesLimits: spec.changesLimits,
    async run(ctx, input: I): Promise<D> {
      const org = ctx.actor.organizationId;
      const member = spec.member(input);
      await requireMemberWithRole(ctx.m, org, input.athleteId, 'athlete', 'athleteId');
      await requireMemberWithRole(ctx.m, org, member.id, member.role, member.field);
      authorize(ctx.ability, 'create', spec.subject, { id: '', organizationId: org, ...input });
      let saved: R;
      try {
        saved = await ctx.m.save(ctx.m.create(spec.entity, { organizationId: org, ...input } as never));
      } catch (err) {
        if (isUniqueViolation(err)) throw new AppError('conflict', spec.duplicate(input));
        throw err;
      }
      await ctx.audit({ action: spec.linked, subjectType: spec.subject, subjectId: saved.id, athleteId: input.athleteId, after: input });
      await spec.changed(ctx, input.athleteId, member.role, 'joined');
      return (await spec.read(ctx.m, input.athleteId)).find((l) => l.id === saved.id)!;
    },
  });
}

function unlinkCommand<R extends CareTeamAssignment | GuardianLink>(name: string, spec: LinkSpec<any, R, any>) {
  return orgCommand({
    name,
    changesLimits: spec.changesLimits,
    async run(ctx, input: { id: string }): Promise<void> {
      const where = { id: input.id, organizationId: ctx.actor.organizationId };
      const row = (await ctx.m.findOne(spec.entity, { where: where as never })) as R | null;
      authorize(ctx.ability, 'delete', spec.subject, row);
      await ctx.m.delete(spec.entity, { id: row.id });
      await ctx.audit({
        action: spec.unlinked,
        subjectType: spec.subject,
        subjectId: row.id,
        athleteId: row.athleteId,
        before: spec.describe(row),
      });
      await spec.changed(ctx, row.athleteId, spec.roleOf(row), 'left');
    },
  });
}

const careTeam: LinkSpec<CareTeamAssignmentCreateInput, CareTeamAssignment, CareTeamAssignmentDto> = {
  subject: 'CareTeamAssignment',
  entity: CareTeamAssignment,
  linked: 'care_team.assigned',
  unlinked: 'care_team.unassigned',
  member: (input) => ({ id: input.memberId, role: input.role, field: 'memberId' }),
  roleOf: (row) => row.role,
  duplicate: (input) => `That person is already on this athlete's care team as ${input.role}.`,
  describe: (row) => ({ athleteId: row.athleteId, memberId: row.memberId, role: row.role }),
  read: (m, athleteId) => careTeamsFor(m, [athleteId]),
  changesLimits: true,
  async changed(ctx, athleteId, role, how) {
    await ctx.limitsChanged({ athleteIds: [athleteId], reason: `${role === 'coach' ? 'A coach' : 'A clinician'} ${how} the care team.` });
  },
};

const guardian: LinkSpec<GuardianLinkCreateInput, GuardianLink, GuardianLinkDto> = {
  subject: 'GuardianLink',
  entity: GuardianLink,
  linked: 'guardian.linked',
  unlinked: 'guardian.unlinked',
  member: (input) => ({ id: input.guardianId, role: 'guardian', field: 'guardianId' }),
  roleOf: () => 'guardian',
  duplicate: () => 'That guardian is already linked to this athlete.',
  describe: (row) => ({ athleteId: row.athleteId, guardianId: row.guardianId }),
  read: (m, athleteId) => guardianLinksFor(m, [athleteId]),
  changesLimits: false,
  // A guardian is told about their athlete but changes nothing the athlete may do.
  changed: async () => undefined,
};

/** Puts a coach or clinician on an athlete's care team. */
export const assignCareTeam = linkCommand('assignCareTeam', careTeam);
/** Takes a coach or clinician off a care team: their access ends on their next request. */
export const unassignCareTeam = unlinkCommand('unassignCareTeam', careTeam);
export const linkGuardian = linkCommand('linkGuardian', guardian);
export const unlinkGuardian = unlinkCommand('unlinkGuardian', guardian);
