import { useState } from 'react';
import type { NoticePreferenceDto } from '../../../../../policies/dto';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { useNoticePreferences, useUpdateNoticePreferences } from '../api/notice-preferences';

/**
 * Which notices also come by e-mail, one switch per kind this person receives; each change saves at
 * once. Notices always appear here in the app. Emergencies are always e-mailed: their box is ticked,
 * cannot be changed, and says so in words (not by a greyed box alone).
 *
 * A box shows its click in the same render (`shown`), not after the mutation's optimistic update: that
 * update first cancels a refetch in flight (e.g. after the offline copy was shown), which waits for the
 * request to end, and a box that lags behind its click reads as broken.
 */
export function EmailPreferences({ orgId }: { orgId: string }) {
  const prefs = useNoticePreferences(orgId);
  const update = useUpdateNoticePreferences(orgId);
  const [shown, setShown] = useState<Record<string, boolean>>({});
  if (prefs.isPending) return <Loading what="your e-mail choices" />;
  if (prefs.isError) return <ErrorNotice error={prefs.error} />;
  if (prefs.data.length === 0) return <p className="text-sm text-ink-2">None of your notices are sent by e-mail.</p>;
  const toggle = (p: NoticePreferenceDto, email: boolean) => {
    setShown((s) => ({ ...s, [p.kind]: email }));
    update.mutate({ email: { [p.kind]: email } }, { onSettled: () => setShown({}) });
  };
  return (
    <fieldset className="space-y-3">
      <legend className="text-sm text-ink-2">Every notice appears on this page. Tick the ones you also want by e-mail.</legend>
      <ErrorNotice error={update.error} />
      {update.isSuccess && (
        <Notice tone="done" role="status">
          <p>Your e-mail choices are saved.</p>
        </Notice>
      )}
      <ul className="space-y-2">
        {prefs.data.map((p) => {
          const id = `email-${p.kind}`;
          return (
            <li key={p.kind} className="flex items-start gap-2">
              <input
                id={id}
                type="checkbox"
                className="mt-0.5 size-5 shrink-0 accent-ink"
                checked={shown[p.kind] ?? p.email}
                disabled={p.fixed}
                aria-describedby={p.fixed ? `${id}-fixed` : undefined}
                onChange={(e) => toggle(p, e.target.checked)}
              />
              <label htmlFor={id} className="text-sm">
                {p.label}
                {p.fixed && (
                  <span id={`${id}-fixed`} className="block text-muted">
                    Emergency: always e-mailed, so it cannot be switched off.
                  </span>
                )}
              </label>
            </li>
          );
        })}
      </ul>
    </fieldset>
  );
}
