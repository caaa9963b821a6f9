/**
 * The audit trail in sentences: "Priya Raman changed Maya Torres's plan (version 3)". One sentence
 * per action the server records; the code stays in the export (and in a detail for the curious),
 * never as the thing people read. `audit-sentences.test.ts` scans the server's sources so a new
 * action cannot be recorded without its sentence here.
 */

export interface AuditSentenceInput {
  action: string;
  actorName: string | null;
  athleteName: string | null;
  subjectType: string;
  before?: unknown;
  after?: unknown;
}

type Entry = Required<Pick<AuditSentenceInput, 'action'>> & AuditSentenceInput;
type Sentence = (who: string, e: Entry) => string;

function field(value: unknown, key: string): unknown {
  return value !== null && typeof value === 'object' ? (value as Record<string, unknown>)[key] : undefined;
}

/** "Maya Torres's plan", or "an athlete's plan" when the entry names no athlete. */
function whose(e: Entry, thing: string): string {
  return e.athleteName ? `${e.athleteName}'s ${thing}` : `an athlete's ${thing}`;
}

function athlete(e: Entry): string {
  return e.athleteName ?? 'an athlete';
}

/** " (version 3)" when the entry carries a version after the change. */
function version(e: Entry): string {
  const v = field(e.after, 'version');
  return typeof v === 'number' ? ` (version ${v})` : '';
}

/** " from the template “Ankle, three stages” (version 2)" when a plan was started from one. */
function fromTemplate(e: Entry): string {
  const t = field(e.after, 'fromTemplate');
  const name = field(t, 'name');
  const v = field(t, 'version');
  return typeof name === 'string' ? ` from the template “${name}”${typeof v === 'number' ? ` (version ${v})` : ''}` : '';
}

const STATUS_WORDS: Record<string, string> = { out: 'Out', limited: 'Limited', full: 'Full' };

function statusWords(e: Entry): string {
  const status = field(e.after, 'status');
  return typeof status === 'string' && STATUS_WORDS[status] ? ` to ${STATUS_WORDS[status]}` : '';
}

function rolesWords(value: unknown): string {
  const roles = field(value, 'roles');
  return Array.isArray(roles) && roles.length ? ` (${roles.join(', ')})` : '';
}

/** Every action the server records, with its sentence. Exported so the test can compare it with the sources. */
export const AUDIT_SENTENCES: Record<string, Sentence> = {
  'access.refused': (who) => `${who} was refused a page or action their role does not allow`,
  'access.not_found': (who) => `${who} asked for a record they may not see (answered "not found")`,
  'access.csrf_refused': (who) => `A request for ${who} was refused because it did not come from Loadline's own pages`,
  'auth.signed_in': (who) => `${who} signed in`,
  'auth.signed_out': (who) => `${who} signed out`,
  // Nobody is signed in when a sign-in fails: the entry names the e-mail that was tried, not an actor.
  'auth.sign_in_failed': (_who, e) => {
    const email = field(e.after, 'email');
    const second = field(e.after, 'step') === 'second';
    return `A sign-in${typeof email === 'string' ? ` as ${email}` : ''} failed${second ? ' at the second step (the code was wrong or used)' : ''}`;
  },
  'auth.sign_in_limited': (_who, e) => {
    const email = field(e.after, 'email');
    return `Sign-in attempts${typeof email === 'string' ? ` as ${email}` : ' from one network address'} were paused after too many tries`;
  },
  'auth.second_step_needed': (who) => `${who} gave the right password and was asked for the second step`,
  'auth.password_reset_requested': (who) => `A password reset was requested for ${who}`,
  'auth.password_reset': (who) => `${who} set a new password with a reset link`,
  'auth.two_step_enabled': (who) => `${who} turned on two-step sign-in`,
  'auth.two_step_disabled': (who) => `${who} turned off two-step sign-in`,
  'auth.recovery_codes_replaced': (who) => `${who} made new recovery codes`,
  'auth.recovery_code_used': (who) => `${who} signed in with a recovery code`,
  'user.created': (who) => `${who}'s account was created`,
  'user.updated': (who) => `${who} changed their account details`,
  'user.password_set': (who) => `${who} chose a password and can now sign in`,
  'roster.previewed': (who, e) =>
    `${who} uploaded a roster of ${String(field(e.after, 'rows') ?? '')} rows to check it (${String(field(e.after, 'skip') ?? 0)} with problems)`,
  'roster.import_started': (who, e) => `${who} started importing a roster of ${String(field(e.after, 'rows') ?? '')} rows`,
  'roster.row_imported': (who, e) => `${who} brought ${athlete(e)} in from a roster (line ${String(field(e.after, 'line') ?? '')})`,
  'roster.imported': (who, e) =>
    `${who}'s roster import finished: ${String(field(e.after, 'created') ?? 0)} added, ${String(field(e.after, 'updated') ?? 0)} completed, ${String(field(e.after, 'unchanged') ?? 0)} unchanged, ${String(field(e.after, 'skipped') ?? 0)} skipped`,
  'roster.import_failed': (who, e) => `${who}'s roster import stopped after ${String(field(e.after, 'processed') ?? 0)} rows`,
  'athlete.updated': (who, e) => `${who} changed ${whose(e, 'details')}`,
  'audit.exported': (who) => `${who} downloaded the audit trail`,
  'demo.loaded': (who) => `${who} loaded the demo`,
  'organization.signup_requested': () => 'Someone asked, on the public page, to start a new organization',
  'organization.signups_purged': (_who, e) =>
    `Loadline deleted ${String(field(e.after, 'deleted') ?? 0)} requests to start an organization that were never confirmed`,
  'organization.created': (who, e) =>
    field(e.after, 'via') === 'operator' ? 'An operator created the organization' : `${who} started the organization`,
  'organization.settings_changed': (who) => `${who} changed the organization's settings`,
  'invitation.created': (who, e) => `${who} invited someone to join${rolesWords(e.after)}`,
  'invitation.revoked': (who) => `${who} withdrew an invitation`,
  'invitation.accepted': (who) => `${who} accepted an invitation and joined`,
  'membership.created': (who, e) => `${who} added a member${rolesWords(e.after)}`,
  'membership.updated': (who, e) => `${who} changed a member's roles${rolesWords(e.after)}`,
  'membership.roles_changed': (who, e) => `${who} changed a member's roles${rolesWords(e.after)}`,
  'membership.removed': (who) => `${who} removed a member from the organization`,
  'care_team.assigned': (who, e) => `${who} added someone to ${whose(e, 'care team')}`,
  'care_team.unassigned': (who, e) => `${who} took someone off ${whose(e, 'care team')}`,
  'guardian.linked': (who, e) => `${who} linked a guardian to ${athlete(e)}`,
  'guardian.unlinked': (who, e) => `${who} unlinked a guardian from ${athlete(e)}`,
  'case.opened': (who, e) => `${who} opened a case for ${athlete(e)}`,
  'case.updated': (who, e) => `${who} changed ${whose(e, 'case')}`,
  'case.closed': (who, e) => `${who} closed ${whose(e, 'case')}`,
  'case.viewed': (who, e) => `${who} read ${whose(e, 'case')}`,
  'status.changed': (who, e) => `${who} changed ${whose(e, 'participation status')}${statusWords(e)}`,
  'plan.created': (who, e) => `${who} wrote ${whose(e, 'restriction plan')}${version(e)}${fromTemplate(e)}`,
  'plan.revised': (who, e) => `${who} changed ${whose(e, 'plan')}${version(e)}`,
  'stage.assessed': (who, e) => `${who} recorded a stage check for ${athlete(e)}`,
  'stage.readiness_rated': (who) => `${who} said how ready they feel for the next stage`,
  'stage.advanced': (who, e) => {
    const early = field(e.after, 'daysEarly');
    const when =
      typeof early === 'number' && early !== 0
        ? ` (${Math.abs(early)} day${Math.abs(early) === 1 ? '' : 's'} ${early > 0 ? 'earlier' : 'later'} than planned)`
        : '';
    return `${who} moved ${athlete(e)} to the next stage of the plan${when}`;
  },
  'baseline.recorded': (who, e) => `${who} recorded a best lift for ${athlete(e)}`,
  'pain_report.created': (who, e) => `${who} sent a pain report${e.athleteName && e.athleteName !== who ? ` for ${e.athleteName}` : ''}`,
  'painReport.viewed': (who, e) => `${who} read ${whose(e, 'pain report')}`,
  'flag.acknowledged': (who, e) => `${who} acknowledged a flag about ${athlete(e)}`,
  'check_in.recorded': (who) => `${who} sent a daily check-in`,
  'training_log.created': (who) => `${who} logged a session`,
  'training_log.pain_after': (who) => `${who} recorded pain after a session`,
  'training_log.next_morning': (who) => `${who} recorded next-morning pain`,
  'training_log.over_limit': (_who, e) => `A session ${athlete(e)} logged went over a limit; the clinician and coach were told`,
  'notification.read': (who) => `${who} read a notice`,
  'notice_preferences.changed': (who) => `${who} changed which notices they get by e-mail`,
  'exercise.created': (who) => `${who} added an exercise to the library`,
  'exercise.updated': (who) => `${who} changed an exercise in the library`,
  'program.created': (who, e) => `${who} started a program${e.athleteName ? ` for ${e.athleteName}` : ''}`,
  'program.updated': (who, e) => `${who} changed ${e.athleteName ? whose(e, 'program') : 'a program'}`,
  'program.shifted': (who, e) => `${who} moved the dates of ${e.athleteName ? whose(e, 'program') : 'a program'}`,
  'program.week_copied': (who, e) => `${who} copied a week of ${e.athleteName ? whose(e, 'program') : 'a program'}`,
  'session.created': (who, e) => `${who} planned a session${e.athleteName ? ` for ${e.athleteName}` : ''}`,
  'session.updated': (who, e) => `${who} changed a session${e.athleteName ? ` of ${e.athleteName}` : ''}`,
  'session.deleted': (who, e) => `${who} deleted a session${e.athleteName ? ` of ${e.athleteName}` : ''}`,
  'session.published': (who, e) => `${who} published a session${e.athleteName ? ` for ${e.athleteName}` : ''}`,
  'session.unpublished': (who, e) => `${who} took back a published session${e.athleteName ? ` of ${e.athleteName}` : ''}`,
  'group.created': (who, e) => `${who} started the group "${String(field(e.after, 'name') ?? '')}"`,
  'group.updated': (who, e) => `${who} renamed or changed the kind of the group "${String(field(e.after, 'name') ?? '')}"`,
  'group.members_changed': (who) => `${who} changed who is in a group`,
  'group.archived': (who, e) => `${who} archived the group "${String(field(e.before, 'name') ?? '')}"`,
  'team_session_hours.recorded': (who, e) =>
    `${who} recorded ${String(field(e.after, 'minutes') ?? '')} minutes of ${String(field(e.after, 'kind') ?? 'practice')} for the group "${String(field(e.after, 'group') ?? '')}" on ${String(field(e.after, 'date') ?? '')}`,
  'team_program.created': (who, e) => `${who} started the team program "${String(field(e.after, 'name') ?? '')}"`,
  'team_program.renamed': (who, e) => `${who} renamed a team program to "${String(field(e.after, 'name') ?? '')}"`,
  'team_session.created': (who) => `${who} planned a team session and fitted it to each athlete`,
  'team_session.updated': (who) => `${who} changed a team session; the athletes' versions followed where not edited by hand`,
  'team_session.deleted': (who) => `${who} deleted a team session and the athletes' versions of it`,
  'team_session.published': (who) => `${who} published a team session to the group`,
  'team_version.accepted': (who, e) => `${who} reviewed ${whose(e, 'version of a team session')}`,
  'team_version.reset': (who, e) => `${who} fitted ${whose(e, 'version of a team session')} again from the team session`,
  'team_version.as_written': (who, e) => `${who} set ${whose(e, 'version of a team session')} to the team's sets as written`,
  'floor_sheet.downloaded': (who, e) => {
    const format = field(e.after, 'format');
    return `${who} downloaded the floor sheet of a team session${format === 'csv' ? ' (CSV)' : format === 'pdf' ? ' (PDF)' : ''}`;
  },
  'case.exported_fhir': (who, e) => `${who} downloaded ${whose(e, 'case')} as a health record (FHIR)`,
  'calendar_feed.started': (who, e) =>
    field(e.after, 'replaced') === true
      ? `${who} made a new address for their private calendar feed, ending the old one`
      : `${who} turned on their private calendar feed`,
  'calendar_feed.stopped': (who) => `${who} turned off their private calendar feed`,
  'plan_template.created': (who, e) => `${who} saved the plan template "${String(field(e.after, 'name') ?? '')}"`,
  'plan_template.updated': (who, e) => `${who} changed the plan template "${String(field(e.after, 'name') ?? '')}"`,
  'plan_template.copied': (who, e) => `${who} copied a plan template as "${String(field(e.after, 'name') ?? '')}"`,
  'plan_template.archived': (who, e) => `${who} archived the plan template "${String(field(e.before, 'name') ?? '')}"`,
  'exception.requested': (who, e) => `${who} asked for an exception to ${whose(e, 'limits')}`,
  'exception.granted': (who, e) => `${who} granted an exception to ${whose(e, 'limits')}`,
  'exception.refused': (who, e) => `${who} refused an exception to ${whose(e, 'limits')}`,
  'letter.drafted': (who, e) => `${who} drafted a clearance letter for ${athlete(e)}`,
  'letter.edited': (who, e) => `${who} edited the draft clearance letter for ${athlete(e)}`,
  'letter.signed': (who, e) => `${who} signed a clearance letter for ${athlete(e)}`,
  'letter.downloaded': (who, e) => `${who} downloaded ${whose(e, 'clearance letter')}`,
  'letter.acknowledged': (who, e) => `${who} acknowledged ${whose(e, 'clearance letter')}`,
  'clip.uploaded': (who, e) => `${who} added a technique clip${e.athleteName ? ` of ${e.athleteName}` : ''}`,
  'clip.viewed': (who, e) => `${who} watched a technique clip${e.athleteName ? ` of ${e.athleteName}` : ''}`,
  'clip.deleted': (who, e) => `${who} deleted a technique clip${e.athleteName ? ` of ${e.athleteName}` : ''}`,
  'clip_note.added': (who) => `${who} added a note to a technique clip`,
  'clip_note.removed': (who) => `${who} removed a note from a technique clip`,
  'case_document.uploaded': (who, e) => `${who} added a document to ${whose(e, 'case')}`,
  'case_document.downloaded': (who, e) => `${who} downloaded a document from ${whose(e, 'case')}`,
  'case_document.deleted': (who, e) => `${who} deleted a document from ${whose(e, 'case')}`,
  'record_export.requested': (who, e) => `${who} asked for a copy of ${whose(e, 'whole record')}`,
  // Written by the background job, in the requester's name: the copy they asked for is ready.
  'record_export.ready': (_who, e) => `The copy of ${whose(e, 'whole record')} was prepared and its link e-mailed`,
  'record_export.failed': (_who, e) => `The copy of ${whose(e, 'whole record')} could not be prepared`,
  'record_export.downloaded': (who, e) => `${who} downloaded the copy of ${whose(e, 'whole record')}`,
};

/** Who did it, as a name: Loadline itself for its own entries (a sweep, an automatic status). */
function actorWords(e: AuditSentenceInput): string {
  return e.actorName ?? 'Loadline';
}

/**
 * The sentence for one entry, with a full stop. An action this table does not know yet (recorded by a
 * newer server) still reads as a sentence, naming the kind of record, never a bare code.
 */
export function auditSentence(e: AuditSentenceInput): string {
  const who = actorWords(e);
  const known = AUDIT_SENTENCES[e.action];
  if (known) return `${known(who, e)}.`;
  const thing = e.subjectType.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
  return `${who} made a change to ${e.athleteName ? whose(e, thing) : `a ${thing}`}.`;
}
