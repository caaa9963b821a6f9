import type { AbilityBuilder } from '@casl/ability';
import type { Actor } from './actor';
import type { AppAbility } from './subjects';

/** Each subject file adds its rules through one of these. Conditions stay plain data. */
export type RuleSet = (builder: AbilityBuilder<AppAbility>, actor: Actor) => void;
