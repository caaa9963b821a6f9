import type { RuleSet } from './builder';

/** A person's own account: name and unit preference. E-mail and password change elsewhere. */
export const userRules: RuleSet = ({ can }, actor) => {
  can('read', 'User', { id: actor.userId });
  can('update', 'User', ['displayName', 'unitPref'], { id: actor.userId });
};
