/**
 * The cautions the app shows, in one place, in the words of the product brief's cautions
 * (shared/PRODUCT.md, "Cautions the product must show"): Loadline supports and records the licensed
 * clinician's decisions and does not diagnose, treat or replace professional care; follow local law,
 * the governing body's rules and the organization's policies; stop a session and tell the clinician
 * if pain rises past the ceiling. Each screen where a decision is acted on carries its own short one,
 * beside the action, never behind a click. The warning signs have their own source, policies/red-flags.ts.
 */
export interface Caution {
  /** A few words that say whose decision this is, read first. */
  lead: string;
  text: string;
}

const FOLLOW_RULES = "Follow local law, your governing body's rules and your organization's policies.";

/** On every page, in the footer. */
export const STANDING_CAUTION =
  "Loadline keeps a record of decisions made by the athlete's licensed clinician. It does not diagnose or treat, and it is no " +
  "substitute for professional care. Follow local law, your sport's governing body and your organization's policies.";

/** Case, plan and pain-report screens, for the clinician who writes the decisions down. */
export const CLINICIAN_RECORD_CAUTION: Caution = {
  lead: 'A record of your decisions, not a diagnosis.',
  text: `Loadline records what the athlete's licensed clinician decides; it does not diagnose, treat or replace professional care. ${FOLLOW_RULES}`,
};

/** The same screens as the rest of the care team reads them. */
export const TEAM_RECORD_CAUTION: Caution = { ...CLINICIAN_RECORD_CAUTION, lead: "The clinician's limits, not a diagnosis." };

/** The program builder, beside Publish: the coach programs under the clinician's line. */
export const PROGRAM_CAUTION: Caution = {
  lead: "The limits are the clinician's decisions.",
  text:
    'Loadline checks each set against them; it does not diagnose, treat or replace professional care. ' +
    'If pain rises past the ceiling the clinician set, stop the session and tell the clinician.',
};

/** The exception decision, beside Grant and Refuse: only the clinician may let a set past a limit. */
export const EXCEPTION_DECISION_CAUTION: Caution = {
  lead: 'Your clinical decision, on the record.',
  text: `Granting lets these sets past your limits. Loadline records your decision and note; it does not diagnose, treat or replace professional care. ${FOLLOW_RULES}`,
};

/** The pain ceiling, for the athlete during a session. */
export const PAIN_CEILING_CAUTION = 'During a session, stop and tell your clinician if pain climbs past the ceiling your clinician set.';
