import type { EntityManager } from 'typeorm';
import { parse } from 'csv-parse/sync';
import type { Role } from '../../../policies/roles';
import { planWords, type RosterMember, type RosterPlan, type RosterRow, type RosterWorld } from '../../../policies/roster';
import { AthleteProfile, CareTeamAssignment, Group, GroupMember, GuardianLink, Membership, User } from '../entities';
import type { OrgCommandCtx } from '../core/command';
import { AppError } from '../core/errors';
import { callWithin } from '../commands/run';
import { createInvitation } from '../commands/invitations';
import { onGroupAthletesChanged } from './team-membership';

/**
 * The organization as the roster import sees it (policies/roster.ts `RosterWorld`), with the ids the
 * writes need beside it. Loaded in a handful of queries for the whole organization, once per preview
 * and once per batch of the import, then kept up to date in memory as rows are applied.
 */
export interface RosterState {
  world: RosterWorld;
  memberIds: Map<string, { membershipId: string; userId: string }>;
  groupIds: Map<string, string>;
}

/**
 * Reads the uploaded bytes as CSV with csv-parse: UTF-8 (a byte-order mark is dropped), the first record
 * is the header, blank lines are skipped, and records of a different length from the header are kept
 * (their missing cells read as empty) so one short row is a row problem, not a refusal of the file.
 */
export function parseRosterCsv(bytes: Buffer): { header: string[]; records: string[][] } {
  const text = new TextDecoder('utf-8', { fatal: false }).decode(bytes);
  if (text.includes('\uFFFD') || text.includes('\u0000'))
    throw new AppError('validation_failed', 'The file is not UTF-8 text. Save the spreadsheet as "CSV UTF-8" and upload it again.', {
      file: ['must be a CSV file in UTF-8'],
    });
  let all: string[][];
  try {
    all = parse(text, { bom: true, skip_empty_lines: true, relax_column_count: true, trim: false });
  } catch (err) {
    const where = (err as { lines?: number }).lines;
    throw new AppError(
      'validation_failed',
      `The file could not be read as CSV${where ? ` (near line ${where})` : ''}: check for an unclosed quotation mark.`,
      { file: ['must be a CSV file'] },
    );
  }
  const [header = [], ...records] = all;
  // A row of empty cells (a spreadsheet's trailing blank lines) is not a row.
  return { header, records: records.filter((r) => r.some((c) => c.trim() !== '')) };
}

export async function loadRosterState(m: EntityManager, organizationId: string): Promise<RosterState> {
  const members: { email: string; id: string; user_id: string; active: boolean; roles: Role[] }[] = await m.query(
    `SELECT lower(u.email) AS email, m.id, m.user_id, m.active, m.roles
       FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.organization_id = $1`,
    [organizationId],
  );
  const links: { athlete_id: string; kind: 'guardian' | 'coach' | 'clinician'; email: string }[] = await m.query(
    `SELECT g.athlete_id, 'guardian' AS kind, lower(u.email) AS email
       FROM guardian_links g JOIN memberships m ON m.id = g.guardian_id JOIN users u ON u.id = m.user_id
      WHERE g.organization_id = $1
     UNION ALL
     SELECT c.athlete_id, c.role AS kind, lower(u.email) AS email
       FROM care_team_assignments c JOIN memberships m ON m.id = c.member_id JOIN users u ON u.id = m.user_id
      WHERE c.organization_id = $1`,
    [organizationId],
  );
  const groups: { id: string; name: string; archived: boolean }[] = await m.query(
    `SELECT id, lower(name) AS name, archived FROM groups WHERE organization_id = $1`,
    [organizationId],
  );
  const inGroups: { member_id: string; name: string }[] = await m.query(
    `SELECT gm.member_id, lower(g.name) AS name FROM group_members gm JOIN groups g ON g.id = gm.group_id
      WHERE gm.organization_id = $1 AND gm.role = 'athlete'`,
    [organizationId],
  );
  const byId = new Map<string, RosterMember>();
  const state: RosterState = {
    world: { members: new Map(), groups: new Map(groups.map((g) => [g.name, { archived: g.archived }])) },
    memberIds: new Map(),
    groupIds: new Map(groups.map((g) => [g.name, g.id])),
  };
  for (const r of members) {
    const member: RosterMember = { active: r.active, roles: r.roles, guardianEmails: [], coachEmails: [], clinicianEmails: [], groups: [] };
    byId.set(r.id, member);
    state.world.members.set(r.email, member);
    state.memberIds.set(r.email, { membershipId: r.id, userId: r.user_id });
  }
  for (const l of links) {
    const a = byId.get(l.athlete_id);
    if (!a) continue;
    (l.kind === 'guardian' ? a.guardianEmails : l.kind === 'coach' ? a.coachEmails : a.clinicianEmails).push(l.email);
  }
  for (const g of inGroups) byId.get(g.member_id)?.groups.push(g.name);
  return state;
}

/** What applying one row did, for the counts and the row's audit entry. */
export interface AppliedRow {
  athleteId: string;
  invitations: number;
  /** The athlete gained a coach (care team, or a group that has coaches): the limits path must know. */
  coachChanged: boolean;
}

/**
 * Makes sure a person is an active member holding `role`: creates the account (with no password: the
 * invitation sets it) and the membership, or adds the role. A new member is invited through the one
 * invitation command, so the link, its audit entry and its e-mail are the same as an admin's invitation.
 */
async function ensurePerson(
  ctx: OrgCommandCtx,
  state: RosterState,
  person: { email: string; name: string; role: Role; step: 'create' | 'add_role' | 'exists'; row?: RosterRow },
): Promise<{ membershipId: string; invited: boolean }> {
  const org = ctx.actor.organizationId;
  const known = state.memberIds.get(person.email);
  if (person.step === 'exists' && known) return { membershipId: known.membershipId, invited: false };
  if (person.step === 'add_role' && known) {
    await ctx.m.query(
      `UPDATE memberships SET roles = array_append(roles, $2), updated_at = now(), version = version + 1
        WHERE id = $1 AND NOT ($2 = ANY(roles))`,
      [known.membershipId, person.role],
    );
    if (person.role === 'athlete') await ensureProfile(ctx, known.membershipId, person.row);
    return { membershipId: known.membershipId, invited: false };
  }
  let user = await ctx.m.findOne(User, { where: { email: person.email } });
  // No password yet: nobody can sign in as this account until the invitation is accepted
  // (services/passwords.ts compares an empty hash like an unknown address).
  user ??= await ctx.m.save(ctx.m.create(User, { email: person.email, displayName: person.name, passwordHash: '', unitPref: 'kg' }));
  const membership = await ctx.m.save(
    ctx.m.create(Membership, { organizationId: org, userId: user.id, roles: [person.role], active: true }),
  );
  state.memberIds.set(person.email, { membershipId: membership.id, userId: user.id });
  if (person.role === 'athlete') await ensureProfile(ctx, membership.id, person.row);
  await callWithin(ctx, createInvitation, {
    email: person.email,
    roles: [person.role],
    displayName: person.name,
    ...(person.role === 'athlete' && person.row?.dateOfBirth ? { dateOfBirth: person.row.dateOfBirth } : {}),
    ...(person.role === 'athlete' && person.row?.sport ? { sport: person.row.sport } : {}),
  });
  return { membershipId: membership.id, invited: true };
}

/** An athlete profile from the row, unless one exists (an existing profile is left as it is). */
async function ensureProfile(ctx: OrgCommandCtx, membershipId: string, row: RosterRow | undefined): Promise<void> {
  await ctx.m
    .createQueryBuilder()
    .insert()
    .into(AthleteProfile)
    .values({
      id: membershipId,
      organizationId: ctx.actor.organizationId,
      dateOfBirth: row?.dateOfBirth ?? null,
      sport: row?.sport ?? null,
      position: row?.position ?? null,
    })
    .orIgnore()
    .execute();
}

/** Applies one row's plan (policies/roster.ts `planRow`) and writes its audit entry. */
export async function applyRosterRow(ctx: OrgCommandCtx, state: RosterState, row: RosterRow, plan: RosterPlan): Promise<AppliedRow> {
  const org = ctx.actor.organizationId;
  const athlete = await ensurePerson(ctx, state, { email: row.email, name: row.name, role: 'athlete', step: plan.athlete, row });
  let invitations = athlete.invited ? 1 : 0;
  let coachChanged = false;
  for (const g of plan.guardians) {
    const guardian = await ensurePerson(ctx, state, { email: g.email, name: g.name, role: 'guardian', step: g.step });
    if (guardian.invited) invitations += 1;
    if (g.link)
      await ctx.m
        .createQueryBuilder()
        .insert()
        .into(GuardianLink)
        .values({ organizationId: org, athleteId: athlete.membershipId, guardianId: guardian.membershipId })
        .orIgnore()
        .execute();
  }
  const care = [
    ...plan.addCoaches.map((e) => ({ email: e, role: 'coach' as const })),
    ...plan.addClinicians.map((e) => ({ email: e, role: 'clinician' as const })),
  ];
  for (const c of care) {
    const memberId = state.memberIds.get(c.email)!.membershipId;
    await ctx.m
      .createQueryBuilder()
      .insert()
      .into(CareTeamAssignment)
      .values({ organizationId: org, athleteId: athlete.membershipId, memberId, role: c.role })
      .orIgnore()
      .execute();
    if (c.role === 'coach') coachChanged = true;
  }
  for (const name of plan.joinGroups) {
    let groupId = state.groupIds.get(name.toLowerCase());
    if (!groupId) {
      const group = await ctx.m.save(ctx.m.create(Group, { organizationId: org, name, kind: 'team', createdBy: ctx.userId }));
      groupId = group.id;
      state.groupIds.set(name.toLowerCase(), groupId);
      await ctx.audit({
        action: 'group.created',
        subjectType: 'Group',
        subjectId: groupId,
        after: { name, kind: 'team', coachIds: [], athleteIds: [], via: 'roster' },
      });
    }
    await ctx.m.insert(GroupMember, { groupId, memberId: athlete.membershipId, role: 'athlete', organizationId: org });
    await onGroupAthletesChanged(ctx.m, { organizationId: org, groupId, added: [athlete.membershipId], removed: [], today: ctx.today });
    if (await ctx.m.exists(GroupMember, { where: { groupId, role: 'coach' } })) coachChanged = true;
  }
  await ctx.audit({
    action: 'roster.row_imported',
    subjectType: 'Athlete',
    subjectId: athlete.membershipId,
    athleteId: athlete.membershipId,
    after: { line: row.line, email: row.email, did: planWords(plan) },
  });
  return { athleteId: athlete.membershipId, invitations, coachChanged };
}
