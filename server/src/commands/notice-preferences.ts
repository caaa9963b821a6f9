import { SWITCHABLE_KINDS, type EmailedKind } from '../../../policies/notice-kinds';
import type { NoticePreferenceDto } from '../../../policies/dto';
import type { NoticePreferencesUpdateInput } from '../../../policies/schemas';
import { orgCommand } from '../core/command';
import { myNoticePreferences } from '../queries/notice-preferences';

/**
 * A person switches the e-mail copy of some kinds of notice on or off, for themselves only (their own
 * membership: nobody sets another's). Emergency kinds never reach here switched off — the schema
 * refuses them, naming the field. The change and its audit entry commit together.
 */
export const updateNoticePreferences = orgCommand({
  name: 'updateNoticePreferences',
  async run(ctx, input: NoticePreferencesUpdateInput): Promise<NoticePreferenceDto[]> {
    const me = ctx.actor.membershipId;
    const asked = Object.entries(input.email).filter(([k, v]) => v !== undefined && SWITCHABLE_KINDS.includes(k as EmailedKind)) as [
      EmailedKind,
      boolean,
    ][];
    const off = asked.filter(([, v]) => !v).map(([k]) => k);
    const on = asked.filter(([, v]) => v).map(([k]) => k);
    const before: { kind: string }[] = await ctx.m.query(`SELECT kind FROM notice_email_opt_outs WHERE member_id = $1`, [me]);
    if (off.length)
      await ctx.m.query(
        `INSERT INTO notice_email_opt_outs (member_id, kind) SELECT $1, unnest($2::varchar[]) ON CONFLICT (member_id, kind) DO NOTHING`,
        [me, off],
      );
    if (on.length) await ctx.m.query(`DELETE FROM notice_email_opt_outs WHERE member_id = $1 AND kind = ANY($2)`, [me, on]);
    const wasOff = new Set(before.map((r) => r.kind));
    const changed = asked.filter(([k, v]) => wasOff.has(k) === v);
    if (changed.length) {
      await ctx.audit({
        action: 'notice_preferences.changed',
        subjectType: 'Membership',
        subjectId: me,
        before: Object.fromEntries(changed.map(([k, v]) => [k, !v])),
        after: Object.fromEntries(changed.map(([k, v]) => [k, v])),
      });
    }
    return myNoticePreferences(ctx.m, me, ctx.actor.roles);
  },
});
