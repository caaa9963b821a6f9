import type { DataSource, EntityManager } from 'typeorm';
import { EMAILED_NOTICE_KINDS, kindsForRoles } from '../../../policies/notice-kinds';
import type { NoticePreferenceDto } from '../../../policies/dto';
import type { Role } from '../../../policies/roles';
import { orgQuery } from '../core/command';

/** A person's e-mail choice for each kind of notice their roles receive; emergencies always on and fixed. */
export async function myNoticePreferences(db: DataSource | EntityManager, memberId: string, roles: Role[]): Promise<NoticePreferenceDto[]> {
  const rows: { kind: string }[] = await db.query(`SELECT kind FROM notice_email_opt_outs WHERE member_id = $1`, [memberId]);
  const off = new Set(rows.map((r) => r.kind));
  return kindsForRoles(roles).map((kind) => {
    const { label, fixed } = EMAILED_NOTICE_KINDS[kind];
    return { kind, label, fixed, email: fixed || !off.has(kind) };
  });
}

export const noticePreferencesQuery = orgQuery({
  name: 'noticePreferences',
  run: (ctx, _input: void) => myNoticePreferences(ctx.db, ctx.actor.membershipId, ctx.actor.roles),
});
