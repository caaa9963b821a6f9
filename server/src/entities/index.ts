import { Organization } from './organization.entity';
import { User } from './user.entity';
import { Membership } from './membership.entity';
import { AthleteProfile } from './athlete-profile.entity';
import { CareTeamAssignment } from './care-team-assignment.entity';
import { GuardianLink } from './guardian-link.entity';
import { Invitation } from './invitation.entity';
import { AuditEntry } from './audit-entry.entity';

export { Organization, User, Membership, AthleteProfile, CareTeamAssignment, GuardianLink, Invitation, AuditEntry };

export const ENTITIES = [
  Organization,
  User,
  Membership,
  AthleteProfile,
  CareTeamAssignment,
  GuardianLink,
  Invitation,
  AuditEntry,
];
