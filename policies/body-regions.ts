/** Body regions for cases and pain reports. Plain words; left and right kept apart where it matters. */
export const BODY_REGIONS = [
  'lower_back',
  'upper_back',
  'neck',
  'head',
  'chest_ribs',
  'abdomen',
  'shoulder_left',
  'shoulder_right',
  'elbow_left',
  'elbow_right',
  'wrist_hand_left',
  'wrist_hand_right',
  'hip_groin_left',
  'hip_groin_right',
  'thigh_left',
  'thigh_right',
  'knee_left',
  'knee_right',
  'lower_leg_left',
  'lower_leg_right',
  'ankle_foot_left',
  'ankle_foot_right',
] as const;
export type BodyRegion = (typeof BODY_REGIONS)[number];

export const BODY_REGION_LABELS: Record<BodyRegion, string> = {
  lower_back: 'Lower back',
  upper_back: 'Upper back',
  neck: 'Neck',
  head: 'Head',
  chest_ribs: 'Chest / ribs',
  abdomen: 'Abdomen',
  shoulder_left: 'Left shoulder',
  shoulder_right: 'Right shoulder',
  elbow_left: 'Left elbow',
  elbow_right: 'Right elbow',
  wrist_hand_left: 'Left wrist / hand',
  wrist_hand_right: 'Right wrist / hand',
  hip_groin_left: 'Left hip / groin',
  hip_groin_right: 'Right hip / groin',
  thigh_left: 'Left thigh',
  thigh_right: 'Right thigh',
  knee_left: 'Left knee',
  knee_right: 'Right knee',
  lower_leg_left: 'Left lower leg',
  lower_leg_right: 'Right lower leg',
  ankle_foot_left: 'Left ankle / foot',
  ankle_foot_right: 'Right ankle / foot',
};

/**
 * The places that add the back-specific warning questions (cauda equina signs, bending backwards).
 * The pelvis has no region of its own: an athlete marks it as hip / groin, so those count too.
 */
export const BACK_OR_PELVIS_REGIONS: readonly BodyRegion[] = ['lower_back', 'upper_back', 'hip_groin_left', 'hip_groin_right'];
