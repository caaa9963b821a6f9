import type { FieldErrors, Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import type { PlannedLoad } from '../../../../../policies/load/compliance';
import { SessionCreateSchema, type SessionCreateInput, type Unit } from '../../../../../policies/schemas';
import type { SessionContent } from '../../../../../policies/schemas/programs';
import type { SchemeSet } from '../../../../../policies/load/set-scheme';

/**
 * The session editor's own shape: what the inputs hold (text), with the load's unit chosen per set.
 * `formToPayload` turns it into the API's shape, which the shared schema then checks.
 */
export const LOAD_UNITS = ['kg', 'lb', 'percent', 'bodyweight'] as const;
export type LoadUnit = (typeof LOAD_UNITS)[number];
export const LOAD_UNIT_LABELS: Record<LoadUnit, string> = { kg: 'kg', lb: 'lb', percent: '% of 1RM', bodyweight: 'bodyweight' };

export interface SetForm {
  setId: string;
  reps: string;
  load: string;
  loadUnit: LoadUnit;
  targetRpe: string;
  rest: string;
  notes: string;
  /** Marked as a warm-up: checked like any set, not counted as a hard set. */
  warmUp: boolean;
}

export interface ExerciseForm {
  rowId: string;
  exerciseId: string;
  notes: string;
  sets: SetForm[];
}

export interface SessionForm {
  date: string;
  title: string;
  exercises: ExerciseForm[];
}

const text = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

export function sessionToForm(session: Pick<ProgramSessionDto, 'date' | 'title' | 'content'>): SessionForm {
  return {
    date: session.date,
    title: session.title,
    exercises: session.content.exercises.map((e) => ({
      rowId: e.id,
      exerciseId: e.exerciseId,
      notes: e.notes ?? '',
      sets: e.sets.map((s) => ({
        setId: s.id,
        reps: String(s.reps),
        load: s.load.kind === 'bodyweight' ? '' : String(s.load.value),
        loadUnit: s.load.kind,
        targetRpe: text(s.targetRpe),
        rest: text(s.restSeconds),
        notes: s.notes ?? '',
        warmUp: s.warmUp ?? false,
      })),
    })),
  };
}

/**
 * A new set copies the one before it, except the warm-up mark: a set added after the warm-ups is a
 * working set unless the coach says otherwise, so it is never left out of the hard-set count by accident.
 */
export function blankSet(unit: Unit, previous?: SetForm): SetForm {
  return previous
    ? { ...previous, setId: crypto.randomUUID(), warmUp: false }
    : { setId: crypto.randomUUID(), reps: '5', load: '', loadUnit: unit, targetRpe: '', rest: '', notes: '', warmUp: false };
}

/**
 * The quick entry's sets in the form's shape, replacing `current`. Reps, load, unit and target RPE come
 * from the scheme; the n-th new set keeps the n-th old set's id (as if each set had been edited in place,
 * so a team set keeps the id its athletes' versions derive from) and its rest, or the last set's rest
 * beyond them. Notes and warm-up marks are cleared: they described the sets that were replaced.
 */
export function schemeToSetForms(sets: readonly SchemeSet[], current: readonly SetForm[] = []): SetForm[] {
  return sets.map((s, i) => {
    const old = current[i];
    return {
      setId: old?.setId ?? crypto.randomUUID(),
      reps: String(s.reps),
      load: s.load.kind === 'bodyweight' ? '' : String(s.load.value),
      loadUnit: s.load.kind,
      targetRpe: text(s.targetRpe),
      rest: (old ?? current[current.length - 1])?.rest ?? '',
      notes: '',
      warmUp: false,
    };
  });
}

export function blankExercise(exerciseId: string, unit: Unit): ExerciseForm {
  return { rowId: crypto.randomUUID(), exerciseId, notes: '', sets: [blankSet(unit)] };
}

/** '' is "not set"; anything else goes to the schema as a number, so "abc" is refused in words. */
function numberOrUndefined(value: string | undefined): number | undefined {
  const t = (value ?? '').trim().replace(',', '.');
  return t === '' ? undefined : Number(t);
}

function loadPayload(set: Pick<SetForm, 'load' | 'loadUnit'>): PlannedLoad {
  return set.loadUnit === 'bodyweight'
    ? { kind: 'bodyweight' }
    : ({ kind: set.loadUnit, value: numberOrUndefined(set.load) } as PlannedLoad);
}

const trimmedOrNull = (v: string | undefined) => (v && v.trim() !== '' ? v.trim() : null);

export function formToContent(form: SessionForm): SessionContent {
  return {
    exercises: (form.exercises ?? []).map((e) => ({
      id: e.rowId,
      exerciseId: e.exerciseId,
      notes: trimmedOrNull(e.notes),
      sets: (e.sets ?? []).map((s) => ({
        id: s.setId,
        reps: numberOrUndefined(s.reps) as number,
        load: loadPayload(s),
        targetRpe: numberOrUndefined(s.targetRpe) ?? null,
        restSeconds: numberOrUndefined(s.rest) ?? null,
        notes: trimmedOrNull(s.notes),
        // Sent only when marked, so an unmarked set's content stays as it was before warm-ups existed.
        ...(s.warmUp ? { warmUp: true } : {}),
      })),
    })),
  };
}

export function formToPayload(form: SessionForm): SessionCreateInput {
  return { date: form.date, title: form.title, content: formToContent(form) };
}

const validNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/**
 * The content as far as it can be checked while it is being typed: a half-typed number does not
 * hide the set from the check (blocked patterns, set counts still apply); it counts as one rep and
 * no load until it is a number.
 */
export function formToCheckable(form: SessionForm): SessionContent {
  const content = formToContent(form);
  return {
    exercises: content.exercises.map((e) => ({
      ...e,
      sets: e.sets.map((s) => ({
        ...s,
        reps: validNumber(s.reps) && Number.isInteger(s.reps) && s.reps >= 1 ? s.reps : 1,
        load: s.load.kind === 'bodyweight' || validNumber(s.load.value) ? s.load : { kind: 'bodyweight' },
        targetRpe: validNumber(s.targetRpe) ? s.targetRpe : null,
      })),
    })),
  };
}

type ErrorTree = Record<string, unknown>;

const SET_FIELDS: Record<string, keyof SetForm> = {
  id: 'setId',
  reps: 'reps',
  load: 'load',
  targetRpe: 'targetRpe',
  restSeconds: 'rest',
  notes: 'notes',
  warmUp: 'warmUp',
};

/** Moves errors from the API's names (content.exercises.0.sets.1.load.value) to the form's. */
function toFormErrors(errors: FieldErrors): FieldErrors<SessionForm> {
  const tree = errors as ErrorTree;
  const content = tree.content as ErrorTree | undefined;
  delete tree.content;
  const exercises = content?.exercises as ErrorTree | undefined;
  if (!exercises) return tree as FieldErrors<SessionForm>;
  const out: ErrorTree = {};
  for (const [key, ex] of Object.entries(exercises)) {
    if (!/^\d+$/.test(key) || !ex || typeof ex !== 'object') {
      out[key] = ex;
      continue;
    }
    const e = ex as ErrorTree;
    const mapped: ErrorTree = { ...e };
    if (e.id) mapped.rowId = e.id;
    const sets = e.sets as ErrorTree | undefined;
    if (sets) {
      const setsOut: ErrorTree = {};
      for (const [k, set] of Object.entries(sets)) {
        if (!/^\d+$/.test(k) || !set || typeof set !== 'object') {
          setsOut[k] = set;
          continue;
        }
        const s = set as ErrorTree;
        const one: ErrorTree = {};
        for (const [api, field] of Object.entries(SET_FIELDS)) {
          const err = s[api] as ErrorTree | undefined;
          if (!err) continue;
          // A load error sits on load.value (the number) or on load itself (the kind).
          one[field] = err.message ? err : ((err.value ?? err.kind ?? err) as ErrorTree);
        }
        setsOut[k] = one;
      }
      mapped.sets = setsOut;
    }
    out[key] = mapped;
  }
  tree.exercises = out;
  return tree as FieldErrors<SessionForm>;
}

/** The same schema the server applies (SessionCreateSchema), run on exactly what would be sent. */
export const sessionFormResolver: Resolver<SessionForm, unknown, SessionCreateInput> = (() => {
  const schemaResolver = zodResolver(SessionCreateSchema);
  return async (values, context, options) => {
    const result = await schemaResolver(formToPayload(values) as never, context, options as never);
    const errors = toFormErrors(result.errors as FieldErrors);
    if (Object.keys(errors).length > 0) return { values: {}, errors };
    return { values: result.values as SessionCreateInput, errors: {} };
  };
})();
