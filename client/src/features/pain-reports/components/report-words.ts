import type { MovementPattern } from '../../../../../policies/load/patterns';

/** Everyday examples beside each movement pattern, so "hinge" means something to a teenager. */
export const PATTERN_EXAMPLES: Record<MovementPattern, string> = {
  hinge: 'bending forward from the hips, deadlifts, picking things up',
  squat: 'squats, sitting down and standing up',
  lunge: 'lunges, step-ups, standing on one leg',
  horizontal_push: 'push-ups, bench press',
  vertical_push: 'pressing overhead',
  horizontal_pull: 'rows, pulling towards your chest',
  vertical_pull: 'pull-ups, pulling down from overhead',
  carry: 'carrying weights or bags',
  rotation: 'twisting, or holding still against a twist',
  jump: 'jumping and landing',
  sprint: 'running fast',
  throw: 'throwing',
  swing: 'swinging a bat or a kettlebell',
};

export const PAIN_LOW = 'No pain';
export const PAIN_HIGH = 'Worst pain you can imagine';
