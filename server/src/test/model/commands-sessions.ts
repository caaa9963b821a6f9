/**
 * Commands of the coach's side (sessions, publishing, exceptions), the clinician's decision on an
 * exception, and the clock moving forward in the organization's zone.
 */
import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import { vi } from 'vitest';
import { blockingBreaches, setKey } from './checker';
import {
  addDays,
  athleteLabel,
  localTime,
  nextWallClock,
  pick,
  programOf,
  todayOf,
  type BlockM,
  type Load,
  type Model,
  type SessionM,
  type SessionView,
} from './model';
import { Step } from './step';
import { call, expectStatus, signInStaff, versionOf, type Real } from './world';

interface SetSpec {
  reps: number;
  load: Load;
  targetRpe: number;
}
interface BlockSpec {
  exercise: number;
  sets: SetSpec[];
}

const toBlocks = (m: Model, specs: BlockSpec[]): BlockM[] =>
  specs.map((b) => ({
    id: randomUUID(),
    exerciseId: pick(m.exercises, b.exercise).id,
    sets: b.sets.map((s) => ({ id: randomUUID(), ...s })),
  }));
const toContent = (blocks: BlockM[]) => ({ exercises: blocks });

/** The athletes for whom the session, as it would stand, has an unwaived breach (publishing or editing it is then refused). */
function refusedFor(m: Model, s: SessionView & { programId: string }): string[] {
  return programOf(m, s.programId).athleteIds.filter((a) => blockingBreaches(m, a, s).length > 0);
}
const why = (m: Model, s: SessionView & { programId: string }) =>
  refusedFor(m, s)
    .map((a) => `athlete ${athleteLabel(m, a)}: ${[...new Set(blockingBreaches(m, a, s).map((b) => b.rule))].join('; ')}`)
    .join(' / ');

/** Publishes a draft: refused (422) exactly when the model finds an unwaived breach for one of its athletes. */
async function publish(m: Model, r: Real, s: SessionM): Promise<string> {
  const res = await call(r, 'coach', 'post', `/sessions/${s.id}/publish`, { version: await versionOf(r, 'program_sessions', s.id) });
  const refused = refusedFor(m, s).length > 0;
  expectStatus(res, [refused ? 422 : 200], `publish ${s.label} on ${s.date}${refused ? ` (model: ${why(m, s)})` : ''}`);
  if (res.status === 200) s.published = true;
  return `${s.label}: publish → ${res.status}${refused ? ` (${why(m, s)})` : ''}`;
}

/** A new draft session, published at once when `publish` (as a coach usually does). */
export class CreateSession extends Step {
  constructor(
    readonly program: number,
    readonly day: number,
    readonly blocks: BlockSpec[],
    readonly publish = false,
  ) {
    super();
  }
  check() {
    return true;
  }
  async act(m: Model, r: Real) {
    const program = pick(m.programs, this.program);
    const date = addDays(todayOf(m), this.day);
    const blocks = toBlocks(m, this.blocks);
    const res = await call(r, 'coach', 'post', `/programs/${program.id}/sessions`, {
      date,
      title: `Day ${date}`,
      content: toContent(blocks),
    });
    expectStatus(res, [201], 'create a session');
    const label = `s${m.sessions.length + 1}`;
    const session: SessionM = { id: res.body.id, label, programId: program.id, date, blocks, published: false };
    m.sessions.push(session);
    const line = `${label}: draft on ${date} for ${program.athleteIds.map((a) => athleteLabel(m, a)).join('+')}: ${JSON.stringify(blocks.map((b) => [b.exerciseId.slice(0, 4), b.sets.map((s) => [s.reps, s.load, s.targetRpe])]))}`;
    return this.publish ? `${line}\n    ${await publish(m, r, session)}` : line;
  }
  toString() {
    return `CreateSession(program ${this.program}, today+${this.day}, ${JSON.stringify(this.blocks)}${this.publish ? ', publish' : ''})`;
  }
}

type Edit = { kind: 'replace'; blocks: BlockSpec[] } | { kind: 'tweak'; set: number; to: Partial<SetSpec> } | { kind: 'move'; day: number };

export class EditSession extends Step {
  constructor(
    readonly which: number,
    readonly edit: Edit,
  ) {
    super();
  }
  check(m: Readonly<Model>) {
    return m.sessions.length > 0;
  }
  async act(m: Model, r: Real) {
    const s = pick(m.sessions, this.which);
    let next: SessionM;
    if (this.edit.kind === 'replace') next = { ...s, blocks: toBlocks(m, this.edit.blocks) };
    else if (this.edit.kind === 'move') next = { ...s, date: addDays(todayOf(m), this.edit.day) };
    else {
      // The same set (same id) with new numbers: a grant on it no longer covers it.
      const target = pick(
        s.blocks.flatMap((b) => b.sets),
        this.edit.set,
      );
      const to = this.edit.to;
      next = { ...s, blocks: s.blocks.map((b) => ({ ...b, sets: b.sets.map((x) => (x === target ? { ...x, ...to } : x)) })) };
    }
    const res = await call(r, 'coach', 'put', `/sessions/${s.id}`, {
      date: next.date,
      content: toContent(next.blocks),
      version: await versionOf(r, 'program_sessions', s.id),
    });
    // A published session is checked again on edit, and the edit refused if it breaches.
    const refused = s.published && refusedFor(m, next).length > 0;
    expectStatus(
      res,
      [refused ? 422 : 200],
      `edit ${s.published ? 'published' : 'draft'} ${s.label}${refused ? ` (${why(m, next)})` : ''}`,
    );
    if (res.status === 200) Object.assign(s, { date: next.date, blocks: next.blocks });
    return `${s.label}: ${this.edit.kind} → ${res.status} (${s.date}: ${JSON.stringify(s.blocks.map((b) => [b.exerciseId.slice(0, 4), b.sets.map((x) => [x.reps, x.load, x.targetRpe])]))})`;
  }
  toString() {
    return `EditSession(session ${this.which}, ${JSON.stringify(this.edit)})`;
  }
}

export class Publish extends Step {
  constructor(readonly which: number) {
    super();
  }
  check(m: Readonly<Model>) {
    return m.sessions.some((s) => !s.published);
  }
  async act(m: Model, r: Real) {
    return publish(
      m,
      r,
      pick(
        m.sessions.filter((x) => !x.published),
        this.which,
      ),
    );
  }
  toString() {
    return `Publish(draft ${this.which})`;
  }
}

export class Unpublish extends Step {
  constructor(readonly which: number) {
    super();
  }
  check(m: Readonly<Model>) {
    return m.sessions.some((s) => s.published);
  }
  async act(m: Model, r: Real) {
    const s = pick(
      m.sessions.filter((x) => x.published),
      this.which,
    );
    const res = await call(r, 'coach', 'post', `/sessions/${s.id}/unpublish`, { version: await versionOf(r, 'program_sessions', s.id) });
    expectStatus(res, [200], `unpublish ${s.label}`);
    s.published = false;
    return `${s.label}: unpublish`;
  }
  toString() {
    return `Unpublish(published ${this.which})`;
  }
}

/** The (session, athlete) pairs with an unwaived breach: where a coach would ask for an exception. */
function breachingPairs(m: Readonly<Model>) {
  return m.sessions.flatMap((s) =>
    programOf(m as Model, s.programId)
      .athleteIds.map((athleteId) => ({ s, athleteId, sets: [...new Set(blockingBreaches(m as Model, athleteId, s).map((b) => b.setId))] }))
      .filter((p) => p.sets.length > 0),
  );
}

export class RequestException extends Step {
  constructor(
    readonly which: number,
    readonly count: number,
  ) {
    super();
  }
  check(m: Readonly<Model>) {
    return breachingPairs(m).length > 0;
  }
  async act(m: Model, r: Real) {
    const { s, athleteId, sets } = pick(breachingPairs(m), this.which);
    const setIds = sets.slice(0, 1 + (this.count % sets.length));
    const res = await call(r, 'coach', 'post', `/sessions/${s.id}/exceptions`, { athleteId, setIds, reason: 'Agreed with the physio' });
    expectStatus(res, [201], 'ask for an exception');
    const label = `x${m.exceptions.length + 1}`;
    m.exceptions.push({ id: res.body.id, label, sessionId: s.id, athleteId, setIds, status: 'pending', grantedSetIds: [], granted: {} });
    return `${label}: exception asked on ${s.label} for athlete ${athleteLabel(m, athleteId)}, ${setIds.length} set(s)`;
  }
  toString() {
    return `RequestException(breaching session ${this.which}, ${this.count})`;
  }
}

export class DecideException extends Step {
  constructor(
    readonly which: number,
    readonly grant: boolean,
    readonly narrow: boolean,
  ) {
    super();
  }
  check(m: Readonly<Model>) {
    return m.exceptions.some((x) => x.status === 'pending');
  }
  async act(m: Model, r: Real) {
    const x = pick(
      m.exceptions.filter((e) => e.status === 'pending'),
      this.which,
    );
    const setIds = this.grant && this.narrow ? x.setIds.slice(0, 1) : undefined;
    const res = await call(r, 'clinician', 'post', `/exceptions/${x.id}/decide`, {
      decision: this.grant ? 'grant' : 'refuse',
      ...(setIds ? { setIds } : {}),
      note: 'Decided with the athlete',
    });
    expectStatus(res, [200], `decide ${x.label}`);
    x.status = this.grant ? 'granted' : 'refused';
    if (this.grant) {
      const s = m.sessions.find((y) => y.id === x.sessionId)!;
      const granted = setIds ?? x.setIds;
      x.grantedSetIds = granted;
      for (const b of s.blocks)
        for (const set of b.sets) if (granted.includes(set.id)) x.granted[set.id] = setKey(b.exerciseId, s.date, set);
    }
    return `${x.label}: ${x.status}${setIds ? ' (one set)' : ''}`;
  }
  toString() {
    return `DecideException(pending ${this.which}, ${this.grant ? 'grant' : 'refuse'}${this.narrow ? ', narrowed' : ''})`;
  }
}

type Move = { to: [hour: number, minute: number] } | { days: number };

/** The clock moves forward; sessions expire after 30 idle minutes, so the staff sign in again. */
export class Advance extends Step {
  constructor(readonly move: Move) {
    super();
  }
  check() {
    return true;
  }
  async act(m: Model, r: Real) {
    m.now = 'to' in this.move ? nextWallClock(m.zone, m.now, ...this.move.to) : m.now + this.move.days * 86_400_000;
    vi.setSystemTime(new Date(m.now));
    await signInStaff(r);
    return `clock → ${localTime(m)} local (${new Date(m.now).toISOString()})`;
  }
  toString() {
    return `Advance(${JSON.stringify(this.move)})`;
  }
}

const setArb: fc.Arbitrary<SetSpec> = fc.record({
  reps: fc.integer({ min: 1, max: 10 }),
  load: fc.oneof(
    fc.integer({ min: 8, max: 80 }).map((n): Load => ({ kind: 'kg', value: n * 2.5 })),
    fc.integer({ min: 6, max: 20 }).map((n): Load => ({ kind: 'percent', value: n * 5 })),
  ),
  targetRpe: fc.integer({ min: 10, max: 20 }).map((n) => n / 2),
});
export const blocksArb = fc.array(fc.record({ exercise: fc.nat(), sets: fc.array(setArb, { minLength: 1, maxLength: 3 }) }), {
  minLength: 1,
  maxLength: 2,
});
// Mostly within the next few days, so that sessions often share an ISO week (weekly limits, exceptions).
export const dayArb = fc.oneof(
  { arbitrary: fc.integer({ min: 0, max: 4 }), weight: 2 },
  { arbitrary: fc.integer({ min: 0, max: 14 }), weight: 1 },
);
const editArb: fc.Arbitrary<Edit> = fc.oneof(
  blocksArb.map((blocks) => ({ kind: 'replace' as const, blocks })),
  fc
    .tuple(
      fc.nat(),
      fc.oneof(
        setArb.map((s) => ({ load: s.load })),
        setArb.map((s) => ({ reps: s.reps, targetRpe: s.targetRpe })),
      ),
    )
    .map(([set, to]) => ({ kind: 'tweak' as const, set, to })),
  dayArb.map((day) => ({ kind: 'move' as const, day })),
);
const moveArb: fc.Arbitrary<Move> = fc.oneof(
  // Just before and just after midnight in the organization's zone, and an evening when the UTC day has turned.
  fc.constantFrom<[number, number]>([23, 30], [0, 30], [6, 0], [18, 0]).map((to) => ({ to })),
  fc.constantFrom(1, 2).map((days) => ({ days })),
);

const times = <T>(n: number, arb: fc.Arbitrary<T>) => Array<fc.Arbitrary<T>>(n).fill(arb);

/** Weighted by repetition: fc.commands picks among the arbitraries evenly. */
export const sessionCommands: fc.Arbitrary<Step>[] = [
  ...times(
    5,
    fc.tuple(fc.nat(), dayArb, blocksArb, fc.boolean()).map(([p, d, b, publish]) => new CreateSession(p, d, b, publish)),
  ),
  ...times(
    2,
    fc.tuple(fc.nat(), editArb).map(([s, e]) => new EditSession(s, e)),
  ),
  ...times(
    2,
    fc.nat().map((s) => new Publish(s)),
  ),
  fc.nat().map((s) => new Unpublish(s)),
  ...times(
    2,
    fc.tuple(fc.nat(), fc.nat()).map(([s, c]) => new RequestException(s, c)),
  ),
  ...times(
    2,
    fc.tuple(fc.nat(), fc.boolean(), fc.boolean()).map(([x, g, n]) => new DecideException(x, g, n)),
  ),
  moveArb.map((move) => new Advance(move)),
];
