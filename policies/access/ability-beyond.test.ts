import { describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../roles';
import type { Actor } from './actor';
import { asSubject, defineAbilityFor } from './ability';
import { LINKED_ATHLETE, ORG, OTHER_ATHLETE, OTHER_ORG, STAFF, actorFor, recordFor } from './ability-fixtures';
import type { Relation } from './matrix';
import { ACTIONS, SUBJECT_NAMES } from './subjects';

describe('defineAbilityFor, beyond the matrix', () => {
  it('a null actor (signed out, or not a member) may do nothing at all', () => {
    const ability = defineAbilityFor(null);
    expect(ability.rules).toEqual([]);
    for (const subject of SUBJECT_NAMES) {
      for (const action of ACTIONS) {
        expect(ability.can(action, subject), `${action} ${subject}`).toBe(false);
        expect(ability.can(action, asSubject(subject, recordFor(subject, 'same-org', actorFor('admin'))) as never)).toBe(false);
      }
    }
  });

  it('no role is ever granted "manage" (every permission is spelled out)', () => {
    for (const role of ROLES) {
      const ability = defineAbilityFor(actorFor(role));
      expect(ability.rules.filter((r) => [r.action].flat().includes('manage'))).toEqual([]);
      expect(ability.rules.filter((r) => [r.subject].flat().includes('all'))).toEqual([]);
    }
  });

  it('nobody, not even an admin with every role, may write or delete an audit entry', () => {
    const everything: Actor = {
      ...actorFor('admin'),
      roles: [...ROLES],
      coachOf: [LINKED_ATHLETE],
      clinicianOf: [LINKED_ATHLETE],
      guardianOf: [LINKED_ATHLETE],
    };
    const ability = defineAbilityFor(everything);
    const entry = asSubject('AuditEntry', { organizationId: ORG });
    expect(ability.can('read', entry)).toBe(true);
    for (const action of ['create', 'update', 'delete', 'manage'] as const) {
      expect(ability.can(action, entry), action).toBe(false);
      expect(ability.can(action, 'AuditEntry'), `${action} on the type`).toBe(false);
    }
  });

  it("an admin may change a membership's roles, but not move it to another organization or another user", () => {
    const ability = defineAbilityFor(actorFor('admin'));
    const membership = asSubject('Membership', { id: STAFF, organizationId: ORG, userId: 'user-staff' });
    expect(ability.can('update', membership, 'roles')).toBe(true);
    expect(ability.can('update', membership, 'organizationId')).toBe(false);
    expect(ability.can('update', membership, 'userId')).toBe(false);
    expect(ability.can('update', membership, 'active')).toBe(false);
    const elsewhere = asSubject('Membership', { id: 'member-in-org-b', organizationId: OTHER_ORG, userId: 'user-in-org-b' });
    expect(ability.can('update', elsewhere, 'roles')).toBe(false);
  });

  it('a person may change only their display name and unit preference on their own account', () => {
    for (const role of ROLES) {
      const actor = actorFor(role);
      const ability = defineAbilityFor(actor);
      const mine = asSubject('User', { id: actor.userId });
      expect(ability.can('update', mine, 'displayName'), role).toBe(true);
      expect(ability.can('update', mine, 'unitPref'), role).toBe(true);
      for (const field of ['email', 'passwordHash', 'id', 'roles'])
        expect(ability.can('update', mine, field), `${role} ${field}`).toBe(false);
      expect(ability.can('update', asSubject('User', { id: 'user-staff' }), 'displayName'), role).toBe(false);
    }
  });

  it("an admin may change an athlete's date of birth, sport and position, and nothing else", () => {
    const ability = defineAbilityFor(actorFor('admin'));
    const athlete = asSubject('Athlete', { id: OTHER_ATHLETE, organizationId: ORG });
    for (const field of ['dateOfBirth', 'sport', 'position']) expect(ability.can('update', athlete, field), field).toBe(true);
    for (const field of ['organizationId', 'id', 'version', 'displayName'])
      expect(ability.can('update', athlete, field), field).toBe(false);
  });

  it("ids alone never open another organization's records", () => {
    // The same athlete and link ids the actors are tied to, but in another organization.
    for (const role of ROLES) {
      const actor = actorFor(role);
      const ability = defineAbilityFor(actor);
      const cases = [
        asSubject('Athlete', { id: LINKED_ATHLETE, organizationId: OTHER_ORG }),
        asSubject('CareTeamAssignment', { id: 'a', organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE }),
        asSubject('GuardianLink', { id: 'l', organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE, guardianId: actor.membershipId }),
        asSubject('Invitation', { id: 'i', organizationId: OTHER_ORG }),
        asSubject('AuditEntry', { organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE }),
        asSubject('AuditChain', { organizationId: OTHER_ORG }),
        asSubject('Organization', { id: OTHER_ORG }),
        asSubject('Case', { id: 'c', organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE }),
        asSubject('ParticipationStatus', { organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE }),
        asSubject('RestrictionPlan', { id: 'p', organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE }),
        asSubject('PainReport', { id: 'r', organizationId: OTHER_ORG, athleteId: actor.membershipId }),
        asSubject('CheckIn', { organizationId: OTHER_ORG, athleteId: actor.membershipId }),
        asSubject('TrainingLog', { id: 't', organizationId: OTHER_ORG, athleteId: actor.membershipId }),
        asSubject('Flag', { id: 'f', organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE }),
        asSubject('Notification', { id: 'n', organizationId: OTHER_ORG, recipientId: actor.membershipId }),
        asSubject('Exercise', { id: 'e', organizationId: OTHER_ORG }),
        asSubject('Baseline', {
          organizationId: OTHER_ORG,
          athleteId: actor.roles.includes('athlete') ? actor.membershipId : LINKED_ATHLETE,
        }),
        asSubject('Program', {
          id: 'p',
          organizationId: OTHER_ORG,
          athleteId: actor.roles.includes('athlete') ? actor.membershipId : LINKED_ATHLETE,
        }),
        asSubject('ProgramException', { id: 'x', organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE }),
        asSubject('Letter', {
          id: 'l',
          organizationId: OTHER_ORG,
          athleteId: actor.roles.includes('athlete') ? actor.membershipId : LINKED_ATHLETE,
        }),
        asSubject('LetterAcknowledgement', { organizationId: OTHER_ORG, athleteId: LINKED_ATHLETE }),
        asSubject('Outbox', { organizationId: OTHER_ORG }),
      ];
      for (const s of cases)
        for (const action of ACTIONS) expect(ability.can(action, s as never), `${role} ${action} ${JSON.stringify(s)}`).toBe(false);
    }
  });

  it('roles add up: a coach who is also a guardian reads both athletes, and still may not edit either', () => {
    const actor: Actor = { ...actorFor('coach'), roles: ['coach', 'guardian'], guardianOf: [OTHER_ATHLETE] };
    const ability = defineAbilityFor(actor);
    for (const id of [LINKED_ATHLETE, OTHER_ATHLETE]) {
      const athlete = asSubject('Athlete', { id, organizationId: ORG });
      expect(ability.can('read', athlete)).toBe(true);
      expect(ability.can('update', athlete)).toBe(false);
    }
    expect(ability.can('read', asSubject('Athlete', { id: 'member-third', organizationId: ORG }))).toBe(false);
  });

  it('a coach, clinician or guardian with no athlete yet still holds the (empty) right to read athletes', () => {
    // So the athletes page answers an empty list, and another team's athlete answers 404, not 403.
    for (const role of ['coach', 'clinician', 'guardian'] as const) {
      const actor: Actor = { ...actorFor(role), coachOf: [], clinicianOf: [], guardianOf: [] };
      const ability = defineAbilityFor(actor);
      expect(ability.can('read', 'Athlete'), role).toBe(true);
      expect(ability.can('read', asSubject('Athlete', { id: LINKED_ATHLETE, organizationId: ORG })), role).toBe(false);
    }
  });

  it('case fields: coaches, guardians and admins never read a diagnosis or clinical notes; the athlete never reads the notes', () => {
    // ASVS 5.0 V8.2.3; 45 CFR 164.502(b) (minimum necessary). The full field lists are in case.ts; these are the lines never to cross.
    const never: Record<Role, string[]> = {
      clinician: [],
      athlete: ['clinicalNotes'],
      coach: ['diagnosis', 'clinicalNotes'],
      guardian: ['diagnosis', 'clinicalNotes', 'bodyRegions', 'onsetDate', 'closingNote'],
      admin: ['diagnosis', 'clinicalNotes', 'bodyRegions', 'onsetDate', 'statusNote', 'closingNote', 'reviewDate'],
    };
    for (const role of ROLES) {
      const actor = actorFor(role);
      const ability = defineAbilityFor(actor);
      const relation: Relation = role === 'athlete' ? 'self' : role === 'admin' ? 'other-athlete' : 'own-care-team';
      const record = asSubject('Case', recordFor('Case', relation, actor));
      expect(ability.can('read', record), role).toBe(true);
      expect(ability.can('read', record, 'status'), `${role} status`).toBe(true);
      for (const field of never[role]) expect(ability.can('read', record, field), `${role} ${field}`).toBe(false);
      if (role === 'clinician') for (const field of ['diagnosis', 'clinicalNotes']) expect(ability.can('read', record, field)).toBe(true);
    }
  });

  it('restriction plans: the care team reads their history, the athlete and guardians only what is in force', () => {
    for (const role of ['athlete', 'coach', 'clinician', 'guardian'] as const) {
      const actor = actorFor(role);
      const ability = defineAbilityFor(actor);
      const plan = asSubject('RestrictionPlan', recordFor('RestrictionPlan', role === 'athlete' ? 'self' : 'own-care-team', actor));
      expect(ability.can('read', plan, 'current'), role).toBe(true);
      expect(ability.can('read', plan, 'history'), role).toBe(role === 'coach' || role === 'clinician');
    }
  });

  it('pain reports: coaches read the scores and places, never the narrative or the red-flag answers', () => {
    for (const role of ['athlete', 'coach', 'clinician'] as const) {
      const actor = actorFor(role);
      const ability = defineAbilityFor(actor);
      const report = asSubject('PainReport', recordFor('PainReport', role === 'athlete' ? 'self' : 'own-care-team', actor));
      expect(ability.can('read', report, 'painNow'), role).toBe(true);
      for (const field of ['note', 'redFlags']) expect(ability.can('read', report, field), `${role} ${field}`).toBe(role !== 'coach');
    }
  });

  it('programs: the athlete reads only the published part of their own; the care team reads drafts too', () => {
    for (const role of ['athlete', 'coach', 'clinician'] as const) {
      const actor = actorFor(role);
      const ability = defineAbilityFor(actor);
      const program = asSubject('Program', recordFor('Program', role === 'athlete' ? 'self' : 'own-care-team', actor));
      expect(ability.can('read', program, 'published'), role).toBe(true);
      expect(ability.can('read', program, 'draft'), `${role} draft`).toBe(role !== 'athlete');
    }
  });

  it('exceptions: a coach who is also a clinician of the athlete may decide; coaching alone never may', () => {
    const coach = defineAbilityFor(actorFor('coach'));
    const exception = asSubject('ProgramException', { id: 'x', organizationId: ORG, athleteId: LINKED_ATHLETE });
    expect(coach.can('create', exception)).toBe(true);
    expect(coach.can('update', exception)).toBe(false);
    const both = defineAbilityFor({ ...actorFor('coach'), roles: ['coach', 'clinician'], clinicianOf: [LINKED_ATHLETE] });
    expect(both.can('update', exception)).toBe(true);
    // Clinician of another athlete: the role alone opens nothing.
    const elsewhere = defineAbilityFor({ ...actorFor('clinician'), clinicianOf: [OTHER_ATHLETE] });
    expect(elsewhere.can('update', exception)).toBe(false);
    expect(elsewhere.can('read', exception)).toBe(false);
  });

  it('letters: everyone around the athlete reads the content; only clinicians and admins read who it was sent to', () => {
    for (const role of ROLES) {
      const actor = actorFor(role);
      const ability = defineAbilityFor(actor);
      const relation: Relation = role === 'athlete' ? 'self' : role === 'admin' ? 'other-athlete' : 'own-care-team';
      const letter = asSubject('Letter', recordFor('Letter', relation, actor));
      expect(ability.can('read', letter, 'content'), `${role} content`).toBe(true);
      expect(ability.can('read', letter, 'deliveries'), `${role} deliveries`).toBe(role === 'clinician' || role === 'admin');
      // No other part of a letter exists to read: an unknown field opens nothing.
      expect(ability.can('read', letter, 'pdfBytes'), `${role} unknown field`).toBe(false);
    }
  });

  it('letters: a clinician of another athlete, or a guardian of another athlete, neither reads, signs nor acknowledges', () => {
    const letter = asSubject('Letter', { id: 'l', organizationId: ORG, athleteId: LINKED_ATHLETE });
    const clinician = defineAbilityFor({ ...actorFor('clinician'), clinicianOf: [OTHER_ATHLETE] });
    expect(clinician.can('read', letter)).toBe(false);
    expect(clinician.can('update', letter)).toBe(false);
    const guardian = defineAbilityFor({ ...actorFor('guardian'), guardianOf: [OTHER_ATHLETE] });
    expect(guardian.can('read', letter)).toBe(false);
    expect(guardian.can('create', asSubject('LetterAcknowledgement', { organizationId: ORG, athleteId: LINKED_ATHLETE }))).toBe(false);
    // …while each still holds the (empty) right, so the list answers [] and the record answers 404.
    expect(clinician.can('read', 'Letter')).toBe(true);
    expect(guardian.can('create', 'LetterAcknowledgement')).toBe(true);
  });

  it('groups: only the coaches of a group keep it; coaching or treating one of its athletes elsewhere opens nothing', () => {
    const group = asSubject('Group', {
      id: 'g',
      organizationId: ORG,
      coachIds: ['member-coach-2'],
      athleteIds: [LINKED_ATHLETE, OTHER_ATHLETE],
    });
    const coach = defineAbilityFor(actorFor('coach'));
    // The coach is on LINKED_ATHLETE's care team, but not a coach of this group.
    expect(coach.can('read', group)).toBe(false);
    expect(coach.can('update', group)).toBe(false);
    const coachOfIt = defineAbilityFor({ ...actorFor('coach'), membershipId: 'member-coach-2' });
    expect(coachOfIt.can('read', group)).toBe(true);
    expect(coachOfIt.can('update', group)).toBe(true);
    // A clinician of any one athlete in the group reads it, and never changes it.
    const clinician = defineAbilityFor(actorFor('clinician'));
    expect(clinician.can('read', group)).toBe(true);
    expect(clinician.can('update', group)).toBe(false);
    const elsewhere = defineAbilityFor({ ...actorFor('clinician'), clinicianOf: ['member-third'] });
    expect(elsewhere.can('read', group)).toBe(false);
    // The athlete in it sees nothing of it; the coach still holds the (empty) right to read groups, so a list answers [].
    expect(defineAbilityFor({ ...actorFor('athlete') }).can('read', group)).toBe(false);
    expect(coach.can('read', 'Group')).toBe(true);
    // The same ids in another organization open nothing, not even for an admin.
    const elsewhereOrg = asSubject('Group', {
      id: 'g',
      organizationId: OTHER_ORG,
      coachIds: ['member-coach-2'],
      athleteIds: [LINKED_ATHLETE],
    });
    for (const ability of [coachOfIt, clinician, defineAbilityFor(actorFor('admin'))])
      for (const action of ACTIONS) expect(ability.can(action, elsewhereOrg), action).toBe(false);
  });

  it("asSubject does not tag the caller's object", () => {
    const record = { id: LINKED_ATHLETE, organizationId: ORG };
    asSubject('Athlete', record);
    expect(Object.keys(record)).toEqual(['id', 'organizationId']);
    expect(Object.getOwnPropertySymbols(record)).toEqual([]);
    expect((record as Record<string, unknown>).__caslSubjectType__).toBeUndefined();
  });
});
