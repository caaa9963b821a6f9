import type { AthleteProfileDto, PersonDto } from '../../../policies/dto';
import type { AthleteProfileUpdateInput, MembershipUpdateInput } from '../../../policies/schemas';
import { AthleteProfile, Membership } from '../entities';
import { orgCommand } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { updateVersioned } from '../services/versioned';
import { athleteProfile } from '../queries/athletes';
import { personOf } from '../queries/people';
import { endSessionsOf } from './account';

/**
 * An admin changes a person's roles. Their other sessions end, so they sign in again under a new
 * session id with the new roles (ASVS 5.0 V7.2.4); a new athlete gets an empty profile. An admin
 * cannot drop their own admin role, so the organization always keeps one.
 */
export const changeRoles = orgCommand({
  name: 'changeRoles',
  async run(ctx, input: MembershipUpdateInput & { id: string; keepSessionId: string | null }): Promise<PersonDto> {
    const { actor } = ctx;
    const membership = await ctx.m.findOne(Membership, { where: { id: input.id, organizationId: actor.organizationId, active: true } });
    authorize(ctx.ability, 'update', 'Membership', membership, 'roles');
    if (membership.id === actor.membershipId && !input.roles.includes('admin')) {
      throw new AppError(
        'conflict',
        'You cannot remove your own admin role. Ask another admin to do it, so the organization always has one.',
      );
    }
    await updateVersioned(ctx.m, Membership, membership.id, input.version, { roles: input.roles, updatedAt: () => 'now()' }, 'person');
    if (input.roles.includes('athlete') && !(await ctx.m.exists(AthleteProfile, { where: { id: membership.id } }))) {
      await ctx.m.save(
        ctx.m.create(AthleteProfile, {
          id: membership.id,
          organizationId: actor.organizationId,
          dateOfBirth: null,
          sport: null,
          position: null,
        }),
      );
    }
    await endSessionsOf(ctx.m, membership.userId, input.keepSessionId);
    await ctx.audit({
      action: 'membership.roles_changed',
      subjectType: 'Membership',
      subjectId: membership.id,
      before: { roles: membership.roles },
      after: { roles: input.roles },
    });
    return personOf(ctx.m, ctx.ability, actor.organizationId, ctx.today, membership.id);
  },
});

/** Removes a person from the organization: the membership goes inactive (their records stay) and every session of theirs ends. */
export const removeMember = orgCommand({
  name: 'removeMember',
  async run(ctx, input: { id: string }): Promise<void> {
    const membership = await ctx.m.findOne(Membership, { where: { id: input.id, organizationId: ctx.actor.organizationId, active: true } });
    authorize(ctx.ability, 'delete', 'Membership', membership);
    if (membership.id === ctx.actor.membershipId) {
      throw new AppError('conflict', 'You cannot remove yourself. Ask another admin to do it.');
    }
    await ctx.m.update(Membership, { id: membership.id }, { active: false });
    await endSessionsOf(ctx.m, membership.userId, null);
    await ctx.audit({
      action: 'membership.removed',
      subjectType: 'Membership',
      subjectId: membership.id,
      before: { roles: membership.roles, active: true },
      after: { active: false },
    });
  },
});

/** Changes an athlete's date of birth, sport or position; each field is checked against the editor's field rules. */
export const updateAthleteProfile = orgCommand({
  name: 'updateAthleteProfile',
  async run(ctx, input: AthleteProfileUpdateInput & { id: string }): Promise<AthleteProfileDto> {
    const { version, id, ...changes } = input;
    const profile = await ctx.m.findOne(AthleteProfile, { where: { id, organizationId: ctx.actor.organizationId } });
    for (const field of Object.keys(changes)) authorize(ctx.ability, 'update', 'Athlete', profile, field);
    authorize(ctx.ability, 'update', 'Athlete', profile);
    await updateVersioned(
      ctx.m,
      AthleteProfile,
      profile.id,
      version,
      { ...changes, updatedAt: () => 'now()' },
      'athlete profile',
      'membership_id',
    );
    const before = Object.fromEntries(Object.keys(changes).map((k) => [k, profile[k as keyof typeof changes]]));
    await ctx.audit({
      action: 'athlete.updated',
      subjectType: 'Athlete',
      subjectId: profile.id,
      athleteId: profile.id,
      before,
      after: changes,
    });
    return athleteProfile(ctx.m, ctx.ability, ctx.actor.organizationId, ctx.today, profile.id);
  },
});
