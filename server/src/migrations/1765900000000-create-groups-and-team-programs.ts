import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Team programming: groups of athletes with their coaches, a program written once for a group, and
 * each athlete's own version of every team session, fitted to that athlete's limits.
 *
 * - A group (a team, a position group, a training block) has coaches and athletes; an athlete may be
 *   in several groups. A coach of a group coaches its athletes as through a care team.
 * - A team program is a `programs` row with `group_id` and no athletes of its own (`athlete_ids` is
 *   empty): no athlete ever reads the team's sessions as written.
 * - Each athlete of the group has one `programs` row per team program (`team_program_id`), whose
 *   sessions are their fitted versions (`team_session_id`): ordinary sessions, so every check, hold,
 *   exception and athlete view works on them unchanged.
 * - An exercise can name exercises to use instead (`use_instead`), in order of preference.
 */
export class CreateGroupsAndTeamPrograms1765900000000 implements MigrationInterface {
  name = 'CreateGroupsAndTeamPrograms1765900000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE groups (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        name varchar(120) NOT NULL,
        kind varchar(20) NOT NULL CHECK (kind IN ('team', 'position', 'block')),
        archived boolean NOT NULL DEFAULT false,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE UNIQUE INDEX groups_org_name_key ON groups (organization_id, lower(name))`);
    await q.query(`
      CREATE TABLE group_members (
        group_id uuid NOT NULL REFERENCES groups(id) ON DELETE CASCADE,
        member_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        role varchar(10) NOT NULL CHECK (role IN ('coach', 'athlete')),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        created_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (group_id, member_id, role)
      )`);
    await q.query(`CREATE INDEX group_members_member_idx ON group_members (member_id, role)`);

    await q.query(`ALTER TABLE programs ADD COLUMN group_id uuid NULL REFERENCES groups(id) ON DELETE CASCADE`);
    await q.query(`ALTER TABLE programs ADD COLUMN team_program_id uuid NULL REFERENCES programs(id) ON DELETE CASCADE`);
    await q.query(`CREATE INDEX programs_group_idx ON programs (group_id) WHERE group_id IS NOT NULL`);
    await q.query(`CREATE INDEX programs_team_program_idx ON programs (team_program_id) WHERE team_program_id IS NOT NULL`);

    await q.query(`ALTER TABLE program_sessions ADD COLUMN team_session_id uuid NULL REFERENCES program_sessions(id) ON DELETE CASCADE`);
    await q.query(
      `ALTER TABLE program_sessions ADD COLUMN fit_state varchar(20) NULL CHECK (fit_state IN ('as_written', 'fitted', 'needs_decision', 'out'))`,
    );
    await q.query(`ALTER TABLE program_sessions ADD COLUMN fit_changes jsonb NOT NULL DEFAULT '[]'`);
    await q.query(`ALTER TABLE program_sessions ADD COLUMN overridden boolean NOT NULL DEFAULT false`);
    await q.query(`ALTER TABLE program_sessions ADD COLUMN needs_review boolean NOT NULL DEFAULT false`);
    await q.query(`ALTER TABLE program_sessions ADD COLUMN proposal jsonb NULL`);
    await q.query(`ALTER TABLE program_sessions ADD COLUMN reviewed_at timestamptz NULL`);
    await q.query(`CREATE INDEX program_sessions_team_session_idx ON program_sessions (team_session_id) WHERE team_session_id IS NOT NULL`);

    await q.query(`ALTER TABLE exercises ADD COLUMN use_instead uuid[] NOT NULL DEFAULT '{}'`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE exercises DROP COLUMN use_instead`);
    for (const c of ['team_session_id', 'fit_state', 'fit_changes', 'overridden', 'needs_review', 'proposal', 'reviewed_at'])
      await q.query(`ALTER TABLE program_sessions DROP COLUMN ${c}`);
    await q.query(`ALTER TABLE programs DROP COLUMN team_program_id`);
    await q.query(`ALTER TABLE programs DROP COLUMN group_id`);
    await q.query(`DROP TABLE group_members`);
    await q.query(`DROP TABLE groups`);
  }
}
