/** Movement patterns a restriction plan speaks about. Trade terms; our own grouping. */
export const MOVEMENT_PATTERNS = [
  'hinge',
  'squat',
  'lunge',
  'horizontal_push',
  'vertical_push',
  'horizontal_pull',
  'vertical_pull',
  'carry',
  'rotation',
  'jump',
  'sprint',
  'throw',
  'swing',
] as const;
export type MovementPattern = (typeof MOVEMENT_PATTERNS)[number];

export const PATTERN_LABELS: Record<MovementPattern, string> = {
  hinge: 'Hinge',
  squat: 'Squat',
  lunge: 'Lunge / single-leg',
  horizontal_push: 'Horizontal push',
  vertical_push: 'Vertical push',
  horizontal_pull: 'Horizontal pull',
  vertical_pull: 'Vertical pull',
  carry: 'Carry',
  rotation: 'Rotation / anti-rotation',
  jump: 'Jump / landing',
  sprint: 'Sprint',
  throw: 'Throw',
  swing: 'Swing',
};

export const PATTERN_MODES = ['blocked', 'capped', 'free'] as const;
export type PatternMode = (typeof PATTERN_MODES)[number];

/** Any subset; absent means "no cap of this kind". Loads are kg (SI), shown in the user's unit. */
export interface Caps {
  maxPercent1RM?: number;
  maxLoadKg?: number;
  maxRpe?: number;
  maxSetsPerSession?: number;
  maxRepsPerSet?: number;
  maxHardSetsPerWeek?: number;
  impactAllowed?: boolean;
}
export const CAP_KEYS = [
  'maxPercent1RM',
  'maxLoadKg',
  'maxRpe',
  'maxSetsPerSession',
  'maxRepsPerSet',
  'maxHardSetsPerWeek',
  'impactAllowed',
] as const;
export type CapKey = (typeof CAP_KEYS)[number];

export interface PatternRule {
  mode: PatternMode;
  caps?: Caps;
}

export const PARTICIPATION_STATUSES = ['out', 'limited', 'full'] as const;
export type ParticipationStatus = (typeof PARTICIPATION_STATUSES)[number];

export const STATUS_LABELS: Record<ParticipationStatus, string> = { out: 'Out', limited: 'Limited', full: 'Full' };

/** Pain ceiling during training when the clinician sets none (Silbernagel et al. 2007, AJSM 35:897–906). */
export const DEFAULT_PAIN_CEILING = 5;
