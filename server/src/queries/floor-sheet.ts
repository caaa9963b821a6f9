import { In, type EntityManager } from 'typeorm';
import { floorRow, type FloorExerciseInput, type FloorSheet, type FloorSetInput } from '../../../policies/load/floor-sheet';
import { plannedKg } from '../../../policies/load/sets';
import { letterPaperOf, type LetterPaper } from '../../../policies/letter-paper';
import type { Unit } from '../../../policies/schemas/common';
import type { SessionContent } from '../../../policies/schemas/programs';
import { Exercise, Program, ProgramSession, SessionHold } from '../entities';
import type { ActorWithOrg } from '../services/actor';
import { currentBaselines } from '../services/programs';
import { athleteRowId, groupAthletes } from '../services/team-fit';
import { memberNames } from './members';
import { isReviewed, teamSessionFor } from './team-programs';

/**
 * The floor sheet of one team session (the page a coach tapes to the rack): every active athlete of the
 * group, each with their own version's sets in their own unit (users.unit_pref), plates per side for barbell
 * sets, and the fitting's mark. Read through the group's rule (services/team-access.ts): admins, the group's
 * coaches, and the clinicians of its athletes; anyone else is told it was not found.
 */
export interface FloorSheetData extends FloorSheet {
  paper: LetterPaper;
  teamSessionId: string;
}

export async function floorSheetFor(m: EntityManager, actor: ActorWithOrg, teamSessionId: string): Promise<FloorSheetData> {
  const { team, program, group } = await teamSessionFor(m, actor, teamSessionId, 'read');
  const [org]: { name: string; time_zone: string; country: string | null; letter_paper: LetterPaper | null }[] = await m.query(
    `SELECT name, time_zone, country, letter_paper FROM organizations WHERE id = $1`,
    [actor.organizationId],
  );
  const athletes = await groupAthletes(m, group.id);
  const names = await memberNames(m, athletes);
  const unitRows: { id: string; unit_pref: Unit }[] = athletes.length
    ? await m.query(`SELECT ms.id, u.unit_pref FROM memberships ms JOIN users u ON u.id = ms.user_id WHERE ms.id = ANY($1)`, [athletes])
    : [];
  const units = new Map(unitRows.map((r) => [r.id, r.unit_pref]));

  const owners = new Map((await m.find(Program, { where: { teamProgramId: program.id } })).map((p) => [p.id, p.athleteIds[0]]));
  const versions = new Map(
    (await m.find(ProgramSession, { where: { teamSessionId: team.id } })).map((v) => [owners.get(v.programId), v] as const),
  );
  const versionIds = [...versions.values()].map((v) => v.id);
  const holds = versionIds.length ? await m.find(SessionHold, { where: { sessionId: In(versionIds) } }) : [];

  const exerciseIds = new Set<string>();
  const collect = (c: SessionContent) => c.exercises.forEach((e) => exerciseIds.add(e.exerciseId));
  collect(team.content);
  for (const v of versions.values()) {
    collect(v.content);
    v.fitChanges.forEach((c) => exerciseIds.add(c.exerciseId));
  }
  const exercises = new Map(
    (exerciseIds.size ? await m.find(Exercise, { where: { id: In([...exerciseIds]), organizationId: actor.organizationId } }) : []).map(
      (e) => [e.id, e] as const,
    ),
  );
  const nameOf = (id: string) => exercises.get(id)?.name ?? 'Exercise';

  const rows = [];
  for (const athleteId of athletes) {
    const v = versions.get(athleteId) ?? null;
    const unit = units.get(athleteId) ?? 'kg';
    const needsPercent = v?.content.exercises.some((e) => e.sets.some((s) => s.load.kind === 'percent'));
    const baselines = needsPercent ? await currentBaselines(m, athleteId) : {};
    const changes = v?.fitChanges ?? [];
    const lines: FloorExerciseInput[] = (v?.content.exercises ?? []).map((row) => {
      const ex = exercises.get(row.exerciseId);
      const mine = changes.filter((c) => athleteRowId(athleteId, c.teamExerciseRowId) === row.id);
      const swap = mine.find((c) => c.kind === 'swapped');
      const oneRm = baselines[ex?.referenceId ?? row.exerciseId];
      const sets: FloorSetInput[] = row.sets.map((s) => ({
        reps: s.reps,
        loadKg: plannedKg(s.load, oneRm),
        percent: s.load.kind === 'percent' ? s.load.value : null,
        targetRpe: s.targetRpe ?? null,
        warmUp: s.warmUp ?? false,
      }));
      return {
        name: ex?.name ?? 'Exercise',
        barbell: ex?.equipment === 'barbell',
        sets,
        changed: mine.length > 0,
        insteadOf: swap ? nameOf(swap.exerciseId) : null,
      };
    });
    // Dropped sets, counted per exercise and reason: "Sprint 20 m, 4 sets (Sprint: Sprint is blocked)"; a change
    // about a whole exercise row (no set named) drops all of its sets.
    const droppedBy = new Map<string, { name: string; note: string; sets: number; whole: boolean }>();
    for (const c of changes.filter((x) => x.kind === 'dropped')) {
      const key = `${c.teamExerciseRowId}\u0000${c.note}`;
      const entry = droppedBy.get(key) ?? { name: nameOf(c.exerciseId), note: c.note, sets: 0, whole: false };
      if (c.teamSetId === null) entry.whole = true;
      else entry.sets++;
      droppedBy.set(key, entry);
    }
    const dropped = [...droppedBy.values()].map(
      (d) => `${d.name}, ${d.whole ? 'all sets' : `${d.sets} ${d.sets === 1 ? 'set' : 'sets'}`}${d.note ? ` (${d.note})` : ''}`,
    );
    rows.push(
      floorRow({
        athleteName: names.get(athleteId) ?? 'Unknown athlete',
        unit,
        state: v ? (v.fitState ?? 'as_written') : null,
        exercises: lines,
        dropped,
        held: !!v && holds.some((h) => h.sessionId === v.id && h.athleteId === athleteId),
        needsReview: !!v && (v.needsReview || v.proposal !== null),
        reviewed: !!v && isReviewed(v),
      }),
    );
  }
  rows.sort((a, b) => a.athleteName.localeCompare(b.athleteName, 'en'));
  return {
    teamSessionId: team.id,
    organizationName: org.name,
    groupName: group.name,
    programName: program.name,
    sessionTitle: team.title,
    date: team.date,
    published: team.status === 'published',
    paper: letterPaperOf({ letterPaper: org.letter_paper, country: org.country, timeZone: org.time_zone }),
    rows,
  };
}
