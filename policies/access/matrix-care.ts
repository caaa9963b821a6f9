import type { Relation } from './matrix';
import type { Action, SubjectName } from './subjects';

/** Rows of the access matrix (matrix.ts) about care and training: cases, limits, reports, flags, notices, exercises, programs, letters, uploads, clips. */
// prettier-ignore
export const CARE_GRID: [SubjectName, Action, Relation, string][] = [
  //                                                     ath coa cli gua adm
  // Injury cases. Everyone around the athlete reads one, each a different set of fields (case.ts,
  // checked field by field in ability.test.ts); admins see only that a case exists. Only the
  // athlete's own clinicians open and update cases; nobody deletes one.
  ['Case',               'read',   'self',            'Y   -   -   -   -'],
  ['Case',               'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['Case',               'read',   'other-athlete',   'n   n   n   n   Y'],
  ['Case',               'read',   'other-org',       'n   n   n   n   n'],
  ['Case',               'create', 'self',            'n   -   -   -   -'],
  ['Case',               'create', 'own-care-team',   '-   n   Y   n   -'],
  ['Case',               'create', 'other-athlete',   'n   n   n   n   n'],
  ['Case',               'create', 'other-org',       'n   n   n   n   n'],
  ['Case',               'update', 'self',            'n   -   -   -   -'],
  ['Case',               'update', 'own-care-team',   '-   n   Y   n   -'],
  ['Case',               'update', 'other-athlete',   'n   n   n   n   n'],
  ['Case',               'update', 'other-org',       'n   n   n   n   n'],
  ['Case',               'delete', 'own-care-team',   '-   n   n   n   -'],
  ['Case',               'delete', 'other-athlete',   'n   n   n   n   n'],

  ['ParticipationStatus', 'read',  'self',            'Y   -   -   -   -'],
  ['ParticipationStatus', 'read',  'own-care-team',   '-   Y   Y   Y   -'],
  ['ParticipationStatus', 'read',  'other-athlete',   'n   n   n   n   Y'],
  ['ParticipationStatus', 'read',  'other-org',       'n   n   n   n   n'],
  ['ParticipationStatus', 'create', 'self',           'n   -   -   -   -'],
  ['ParticipationStatus', 'create', 'own-care-team',  '-   n   Y   n   -'],
  ['ParticipationStatus', 'create', 'other-athlete',  'n   n   n   n   n'],
  ['ParticipationStatus', 'create', 'other-org',      'n   n   n   n   n'],

  // Functional limits, not clinical content: the athlete's circle reads them; admins see none.
  ['RestrictionPlan',    'read',   'self',            'Y   -   -   -   -'],
  ['RestrictionPlan',    'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['RestrictionPlan',    'read',   'other-athlete',   'n   n   n   n   n'],
  ['RestrictionPlan',    'read',   'other-org',       'n   n   n   n   n'],
  ['RestrictionPlan',    'create', 'self',            'n   -   -   -   -'],
  ['RestrictionPlan',    'create', 'own-care-team',   '-   n   Y   n   -'],
  ['RestrictionPlan',    'create', 'other-athlete',   'n   n   n   n   n'],
  ['RestrictionPlan',    'create', 'other-org',       'n   n   n   n   n'],
  ['RestrictionPlan',    'update', 'self',            'n   -   -   -   -'],
  ['RestrictionPlan',    'update', 'own-care-team',   '-   n   Y   n   -'],
  ['RestrictionPlan',    'update', 'other-athlete',   'n   n   n   n   n'],
  ['RestrictionPlan',    'update', 'other-org',       'n   n   n   n   n'],
  ['RestrictionPlan',    'delete', 'own-care-team',   '-   n   n   n   -'],

  // What the athlete reports: they write their own; their coaches and clinicians read it (coaches
  // without the pain narrative or red-flag answers, checked in ability.test.ts); guardians and admins
  // read none of it.
  ['PainReport',         'read',   'self',            'Y   -   -   -   -'],
  ['PainReport',         'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['PainReport',         'read',   'other-athlete',   'n   n   n   n   n'],
  ['PainReport',         'read',   'other-org',       'n   n   n   n   n'],
  ['PainReport',         'create', 'self',            'Y   -   -   -   -'],
  ['PainReport',         'create', 'own-care-team',   '-   n   n   n   -'],
  ['PainReport',         'create', 'other-athlete',   'n   n   n   n   n'],
  ['PainReport',         'create', 'other-org',       'n   n   n   n   n'],
  ['PainReport',         'update', 'self',            'n   -   -   -   -'],
  ['PainReport',         'update', 'own-care-team',   '-   n   n   n   -'],

  ['CheckIn',            'read',   'self',            'Y   -   -   -   -'],
  ['CheckIn',            'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['CheckIn',            'read',   'other-athlete',   'n   n   n   n   n'],
  ['CheckIn',            'read',   'other-org',       'n   n   n   n   n'],
  ['CheckIn',            'create', 'self',            'Y   -   -   -   -'],
  ['CheckIn',            'create', 'own-care-team',   '-   n   n   n   -'],
  ['CheckIn',            'create', 'other-athlete',   'n   n   n   n   n'],
  ['CheckIn',            'create', 'other-org',       'n   n   n   n   n'],

  ['TrainingLog',        'read',   'self',            'Y   -   -   -   -'],
  ['TrainingLog',        'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['TrainingLog',        'read',   'other-athlete',   'n   n   n   n   n'],
  ['TrainingLog',        'read',   'other-org',       'n   n   n   n   n'],
  ['TrainingLog',        'create', 'self',            'Y   -   -   -   -'],
  ['TrainingLog',        'create', 'own-care-team',   '-   n   n   n   -'],
  ['TrainingLog',        'create', 'other-athlete',   'n   n   n   n   n'],
  ['TrainingLog',        'create', 'other-org',       'n   n   n   n   n'],
  ['TrainingLog',        'update', 'self',            'Y   -   -   -   -'],
  ['TrainingLog',        'update', 'own-care-team',   '-   n   n   n   -'],
  ['TrainingLog',        'update', 'other-athlete',   'n   n   n   n   n'],
  ['TrainingLog',        'update', 'other-org',       'n   n   n   n   n'],

  // Flags raised from reports are for the care team to see and resolve, not the athlete or guardian.
  ['Flag',               'read',   'self',            'n   -   -   -   -'],
  ['Flag',               'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['Flag',               'read',   'other-athlete',   'n   n   n   n   n'],
  ['Flag',               'read',   'other-org',       'n   n   n   n   n'],
  ['Flag',               'update', 'self',            'n   -   -   -   -'],
  ['Flag',               'update', 'own-care-team',   '-   Y   Y   n   -'],
  ['Flag',               'update', 'other-athlete',   'n   n   n   n   n'],
  ['Flag',               'update', 'other-org',       'n   n   n   n   n'],

  // 'self' is a notice to the actor; 'same-org' a notice to someone else.
  ['Notification',       'read',   'self',            'Y   Y   Y   Y   Y'],
  ['Notification',       'read',   'same-org',        'n   n   n   n   n'],
  ['Notification',       'read',   'other-org',       'n   n   n   n   n'],
  ['Notification',       'update', 'self',            'Y   Y   Y   Y   Y'],
  ['Notification',       'update', 'same-org',        'n   n   n   n   n'],
  ['Notification',       'update', 'other-org',       'n   n   n   n   n'],

  // The organization's exercise library: names and movement patterns, nothing about a person, so
  // every member reads it (athletes and guardians see exercise names in sessions). Coaches and
  // admins keep it; nobody deletes an exercise (archiving is an update), so old sessions still resolve.
  ['Exercise',           'read',   'same-org',        'Y   Y   Y   Y   Y'],
  ['Exercise',           'read',   'other-org',       'n   n   n   n   n'],
  ['Exercise',           'create', 'same-org',        'n   Y   n   n   Y'],
  ['Exercise',           'create', 'other-org',       'n   n   n   n   n'],
  ['Exercise',           'update', 'same-org',        'n   Y   n   n   Y'],
  ['Exercise',           'update', 'other-org',       'n   n   n   n   n'],
  ['Exercise',           'delete', 'same-org',        'n   n   n   n   n'],

  // Plan templates: the clinicians' shared protocols, about no athlete. 'self' is a template the
  // actor wrote (only clinicians write them); 'same-org' one another member wrote. Every clinician
  // reads and copies any of them; only the author — or an admin — changes or archives one (an
  // update). Coaches, athletes and guardians see none. Nobody deletes one.
  ['PlanTemplate',       'read',   'self',            '-   -   Y   -   -'],
  ['PlanTemplate',       'read',   'same-org',        'n   n   Y   n   Y'],
  ['PlanTemplate',       'read',   'other-org',       'n   n   n   n   n'],
  ['PlanTemplate',       'create', 'same-org',        'n   n   Y   n   n'],
  ['PlanTemplate',       'create', 'other-org',       'n   n   n   n   n'],
  ['PlanTemplate',       'update', 'self',            '-   -   Y   -   -'],
  ['PlanTemplate',       'update', 'same-org',        'n   n   n   n   Y'],
  ['PlanTemplate',       'update', 'other-org',       'n   n   n   n   n'],
  ['PlanTemplate',       'delete', 'same-org',        'n   n   n   n   n'],

  // Strength baselines (tested or estimated 1RM): the care team records and reads them, the athlete
  // reads their own; guardians and admins none. Append-only: a new baseline replaces, never edits.
  ['Baseline',           'read',   'self',            'Y   -   -   -   -'],
  ['Baseline',           'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['Baseline',           'read',   'other-athlete',   'n   n   n   n   n'],
  ['Baseline',           'read',   'other-org',       'n   n   n   n   n'],
  ['Baseline',           'create', 'self',            'n   -   -   -   -'],
  ['Baseline',           'create', 'own-care-team',   '-   Y   Y   n   -'],
  ['Baseline',           'create', 'other-athlete',   'n   n   n   n   n'],
  ['Baseline',           'create', 'other-org',       'n   n   n   n   n'],
  ['Baseline',           'update', 'own-care-team',   '-   n   n   n   -'],
  ['Baseline',           'delete', 'own-care-team',   '-   n   n   n   -'],

  // A program as seen for one of its athletes (a group program is checked athlete by athlete).
  // Coaches build and edit programs for their care-team athletes; clinicians read them; the athlete
  // reads their own, published sessions only (the 'published' field, checked in ability.test.ts).
  // Guardians and admins see none. Sessions are removed through 'update'; a program is never deleted.
  ['Program',            'read',   'self',            'Y   -   -   -   -'],
  ['Program',            'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['Program',            'read',   'other-athlete',   'n   n   n   n   n'],
  ['Program',            'read',   'other-org',       'n   n   n   n   n'],
  ['Program',            'create', 'self',            'n   -   -   -   -'],
  ['Program',            'create', 'own-care-team',   '-   Y   n   n   -'],
  ['Program',            'create', 'other-athlete',   'n   n   n   n   n'],
  ['Program',            'create', 'other-org',       'n   n   n   n   n'],
  ['Program',            'update', 'self',            'n   -   -   -   -'],
  ['Program',            'update', 'own-care-team',   '-   Y   n   n   -'],
  ['Program',            'update', 'other-athlete',   'n   n   n   n   n'],
  ['Program',            'update', 'other-org',       'n   n   n   n   n'],
  ['Program',            'delete', 'own-care-team',   '-   n   n   n   -'],

  // Going past a cap: the athlete's coach asks, the athlete's clinician decides ('update'); both read
  // the requests. The athlete, guardians and admins neither ask, decide nor read.
  ['ProgramException',   'read',   'self',            'n   -   -   -   -'],
  ['ProgramException',   'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['ProgramException',   'read',   'other-athlete',   'n   n   n   n   n'],
  ['ProgramException',   'read',   'other-org',       'n   n   n   n   n'],
  ['ProgramException',   'create', 'self',            'n   -   -   -   -'],
  ['ProgramException',   'create', 'own-care-team',   '-   Y   n   n   -'],
  ['ProgramException',   'create', 'other-athlete',   'n   n   n   n   n'],
  ['ProgramException',   'create', 'other-org',       'n   n   n   n   n'],
  ['ProgramException',   'update', 'self',            'n   -   -   -   -'],
  ['ProgramException',   'update', 'own-care-team',   '-   n   Y   n   -'],
  ['ProgramException',   'update', 'other-athlete',   'n   n   n   n   n'],
  ['ProgramException',   'update', 'other-org',       'n   n   n   n   n'],
  ['ProgramException',   'delete', 'own-care-team',   '-   n   n   n   -'],

  // Clearance letters carry status and limits only (45 CFR 164.502(b) minimum necessary), so the athlete's whole circle
  // reads them (the 'content' field; who sent what, 'deliveries', is for clinicians and admins,
  // checked in ability.test.ts); admins read every letter for the record. Only the athlete's own
  // clinicians draft and sign; a signed letter is never deleted, a later one supersedes it.
  ['Letter',             'read',   'self',            'Y   -   -   -   -'],
  ['Letter',             'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['Letter',             'read',   'other-athlete',   'n   n   n   n   Y'],
  ['Letter',             'read',   'other-org',       'n   n   n   n   n'],
  ['Letter',             'create', 'self',            'n   -   -   -   -'],
  ['Letter',             'create', 'own-care-team',   '-   n   Y   n   -'],
  ['Letter',             'create', 'other-athlete',   'n   n   n   n   n'],
  ['Letter',             'create', 'other-org',       'n   n   n   n   n'],
  ['Letter',             'update', 'self',            'n   -   -   -   -'],
  ['Letter',             'update', 'own-care-team',   '-   n   Y   n   -'],
  ['Letter',             'update', 'other-athlete',   'n   n   n   n   n'],
  ['Letter',             'update', 'other-org',       'n   n   n   n   n'],
  ['Letter',             'delete', 'self',            'n   -   -   -   -'],
  ['Letter',             'delete', 'own-care-team',   '-   n   n   n   -'],
  ['Letter',             'delete', 'other-athlete',   'n   n   n   n   n'],

  // A guardian acknowledges a letter about the athlete they are linked to, and reads that they did.
  ['LetterAcknowledgement', 'read',   'self',          'n   -   -   -   -'],
  ['LetterAcknowledgement', 'read',   'own-care-team', '-   n   n   Y   -'],
  ['LetterAcknowledgement', 'read',   'other-athlete', 'n   n   n   n   n'],
  ['LetterAcknowledgement', 'read',   'other-org',     'n   n   n   n   n'],
  ['LetterAcknowledgement', 'create', 'self',          'n   -   -   -   -'],
  ['LetterAcknowledgement', 'create', 'own-care-team', '-   n   n   Y   -'],
  ['LetterAcknowledgement', 'create', 'other-athlete', 'n   n   n   n   n'],
  ['LetterAcknowledgement', 'create', 'other-org',     'n   n   n   n   n'],
  ['LetterAcknowledgement', 'delete', 'own-care-team', '-   n   n   n   -'],

  // The local fake mail server's messages: the admin's outbox page, read-only.
  ['Outbox',             'read',   'same-org',        'n   n   n   n   Y'],
  ['Outbox',             'read',   'other-org',       'n   n   n   n   n'],
  ['Outbox',             'create', 'same-org',        'n   n   n   n   n'],
  ['Outbox',             'update', 'same-org',        'n   n   n   n   n'],
  ['Outbox',             'delete', 'same-org',        'n   n   n   n   n'],
  // Outside documents on a case: clinicians on the team and the athlete only (coaches, guardians
  // and admins never). 'delete' rows are about the actor's own upload.
  ['CaseDocument',       'read',   'self',            'Y   -   -   -   -'],
  ['CaseDocument',       'read',   'own-care-team',   '-   n   Y   n   -'],
  ['CaseDocument',       'read',   'other-athlete',   'n   n   n   n   n'],
  ['CaseDocument',       'read',   'other-org',       'n   n   n   n   n'],
  ['CaseDocument',       'create', 'self',            'Y   -   -   -   -'],
  ['CaseDocument',       'create', 'own-care-team',   '-   n   Y   n   -'],
  ['CaseDocument',       'create', 'other-athlete',   'n   n   n   n   n'],
  ['CaseDocument',       'create', 'other-org',       'n   n   n   n   n'],
  ['CaseDocument',       'delete', 'self',            'Y   -   -   -   -'],
  ['CaseDocument',       'delete', 'own-care-team',   '-   n   Y   n   -'],
  ['CaseDocument',       'delete', 'other-athlete',   'n   n   n   n   n'],
  ['CaseDocument',       'delete', 'other-org',       'n   n   n   n   n'],

  // Technique clips: the athlete and the care team; guardians only when the organization turns it
  // on (the matrix's actor has the setting off). 'delete' rows are about the actor's own upload.
  ['Clip',               'read',   'self',            'Y   -   -   -   -'],
  ['Clip',               'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['Clip',               'read',   'other-athlete',   'n   n   n   n   n'],
  ['Clip',               'read',   'other-org',       'n   n   n   n   n'],
  ['Clip',               'create', 'self',            'Y   -   -   -   -'],
  ['Clip',               'create', 'own-care-team',   '-   Y   n   n   -'],
  ['Clip',               'create', 'other-athlete',   'n   n   n   n   n'],
  ['Clip',               'create', 'other-org',       'n   n   n   n   n'],
  ['Clip',               'delete', 'self',            'Y   -   -   -   -'],
  ['Clip',               'delete', 'own-care-team',   '-   Y   n   n   -'],
  ['Clip',               'delete', 'other-athlete',   'n   n   n   n   n'],
  ['Clip',               'delete', 'other-org',       'n   n   n   n   n'],
  ['ClipNote',           'read',   'self',            'Y   -   -   -   -'],
  ['ClipNote',           'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['ClipNote',           'read',   'other-athlete',   'n   n   n   n   n'],
  ['ClipNote',           'read',   'other-org',       'n   n   n   n   n'],
  ['ClipNote',           'create', 'self',            'n   -   -   -   -'],
  ['ClipNote',           'create', 'own-care-team',   '-   Y   Y   n   -'],
  ['ClipNote',           'create', 'other-athlete',   'n   n   n   n   n'],
  ['ClipNote',           'create', 'other-org',       'n   n   n   n   n'],
  ['ClipNote',           'delete', 'own-care-team',   '-   Y   Y   n   -'],
  ['ClipNote',           'delete', 'other-athlete',   'n   n   n   n   n'],
  ['ClipNote',           'delete', 'other-org',       'n   n   n   n   n'],
];
