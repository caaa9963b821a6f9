import type { EntityManager } from 'typeorm';
import { Notification } from '../entities';
import { getNoticeQueue } from '../jobs/queue';
import { enqueueEmail } from '../mail/deliveries';
import { emails } from '../../../templates/email/messages';
import { ALWAYS_EMAILED_KINDS, EMAILED_KIND_IDS } from '../../../policies/notice-kinds';

/** Notices that also go out by e-mail: the ones someone must act on or be told of (policies/notice-kinds.ts). */
const EMAILED_KINDS = new Set<string>(EMAILED_KIND_IDS);
const ALWAYS_EMAILED = new Set<string>(ALWAYS_EMAILED_KINDS);

export interface AthleteCircle {
  clinicians: string[];
  coaches: string[];
  guardians: string[];
}

/** The active people around an athlete: care-team clinicians and coaches, the coaches of their groups (each holding that role) and guardians. */
export async function athleteCircle(m: EntityManager, athleteId: string): Promise<AthleteCircle> {
  const rows: { member_id: string; role: 'coach' | 'clinician' | 'guardian' }[] = await m.query(
    `SELECT c.member_id, c.role FROM care_team_assignments c
       JOIN memberships mm ON mm.id = c.member_id AND mm.active AND c.role = ANY(mm.roles)
      WHERE c.athlete_id = $1
     UNION ALL
     SELECT gc.member_id, 'coach' FROM group_members ga
       JOIN groups g ON g.id = ga.group_id AND NOT g.archived
       JOIN group_members gc ON gc.group_id = ga.group_id AND gc.role = 'coach'
       JOIN memberships cm ON cm.id = gc.member_id AND cm.active AND 'coach' = ANY(cm.roles)
      WHERE ga.member_id = $1 AND ga.role = 'athlete'
     UNION ALL
     SELECT g.guardian_id, 'guardian' FROM guardian_links g
       JOIN memberships gm ON gm.id = g.guardian_id AND gm.active AND 'guardian' = ANY(gm.roles)
      WHERE g.athlete_id = $1`,
    [athleteId],
  );
  const pick = (role: string) => [...new Set(rows.filter((r) => r.role === role).map((r) => r.member_id))];
  return { clinicians: pick('clinician'), coaches: pick('coach'), guardians: pick('guardian') };
}

export interface NoticeInput {
  organizationId: string;
  athleteId: string | null;
  kind: string;
  severity: Notification['severity'];
  title: string;
  body: string;
}

const TITLE_MAX = 200;

/**
 * A title that fits its column: one built from a long name and a long exercise can pass 200
 * characters, and is then cut with an ellipsis (whole characters, never half a surrogate pair)
 * rather than refusing the change that caused it.
 */
export function fitTitle(title: string): string {
  const chars = Array.from(title);
  return chars.length <= TITLE_MAX ? title : `${chars.slice(0, TITLE_MAX - 1).join('')}…`;
}

/** In-app notices, written in the caller's transaction so a notice exists exactly when its cause does. */
export async function notify(m: EntityManager, recipientIds: string[], input: NoticeInput): Promise<void> {
  const unique = [...new Set(recipientIds)];
  if (unique.length === 0) return;
  const notice = { ...input, title: fitTitle(input.title) };
  await m.insert(
    Notification,
    unique.map((recipientId) => ({ ...notice, recipientId })),
  );
  const queue = getNoticeQueue();
  if (!queue || !EMAILED_KINDS.has(notice.kind)) return;
  // Each person's choice is respected, except for emergencies, which always go (a stored row is ignored).
  const people: { id: string; email: string; name: string }[] = await m.query(
    `SELECT m.id, u.email, u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id
      WHERE m.id = ANY($1) AND ($3 OR NOT EXISTS (SELECT 1 FROM notice_email_opt_outs o WHERE o.member_id = m.id AND o.kind = $2))`,
    [unique, notice.kind, ALWAYS_EMAILED.has(notice.kind)],
  );
  for (const p of people) {
    await enqueueEmail(m, queue, {
      organizationId: notice.organizationId,
      kind: `notice:${notice.kind}`,
      to: p.email,
      recipientId: p.id,
      content: emails.notice({ name: p.name, title: notice.title, body: notice.body, url: `${noticeBaseUrl}/notices` }),
    });
  }
}

/** Base URL for links in e-mails (PUBLIC_URL, or the server's own address). */
let noticeBaseUrl = 'http://127.0.0.1:3000';
export function setNoticeBaseUrl(url: string): void {
  noticeBaseUrl = url.replace(/\/$/, '');
}
