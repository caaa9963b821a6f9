import type { PlanChange } from '../../../../../policies/load/plan-diff';

/** What changed between two versions, one row per change: where, what, before → after. */
export function PlanDiffTable({ changes, caption }: { changes: PlanChange[]; caption: string }) {
  if (changes.length === 0) return <p className="text-sm text-ink-2">These two versions say the same thing.</p>;
  return (
    <div role="region" aria-label={caption} tabIndex={0} className="overflow-x-auto rounded-md border border-rule">
      <table className="w-full min-w-[36rem] border-collapse text-left text-sm">
        <caption className="px-3 pt-2 text-left font-semibold">{caption}</caption>
        <thead>
          <tr className="border-b border-rule bg-shade">
            <th scope="col" className="px-3 py-2">
              Where
            </th>
            <th scope="col" className="px-3 py-2">
              What
            </th>
            <th scope="col" className="px-3 py-2">
              Before → after
            </th>
          </tr>
        </thead>
        <tbody>
          {changes.map((c, i) => (
            <tr key={`${c.where}-${c.what}-${i}`} className="border-b border-rule align-top last:border-b-0">
              <td className="px-3 py-1.5 whitespace-nowrap">{c.where}</td>
              <td className="px-3 py-1.5">{c.what}</td>
              <td className="px-3 py-1.5 tabular-nums">
                <span className="text-ink-2">{c.before ?? <span className="text-muted">not set</span>}</span>
                <span aria-hidden="true" className="px-1.5 text-line-deep">
                  →
                </span>
                <span className="sr-only"> changed to </span>
                <span className="font-semibold">{c.after ?? <span className="font-normal text-muted">not set</span>}</span>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
