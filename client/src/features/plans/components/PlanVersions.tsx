import { useId, useState } from 'react';
import type { PlanVersionDto } from '../../../../../policies/dto';
import { diffPlans } from '../../../../../policies/load/plan-diff';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { formatDateTime } from '../../../lib/format';
import { usePlanVersions } from '../api/get-plan-versions';
import { PlanDiffTable } from './PlanDiffTable';

export function PlanVersions({ orgId, planId }: { orgId: string; planId: string }) {
  const versions = usePlanVersions(orgId, planId);
  if (versions.isPending) return <Loading what="the versions" />;
  if (versions.isError) return <ErrorNotice error={versions.error} />;
  return <VersionsList versions={versions.data} />;
}

/** Who saved each version and when; pick any two to see what changed between them. */
export function VersionsList({ versions }: { versions: PlanVersionDto[] }) {
  const fromId = useId();
  const toId = useId();
  const [from, setFrom] = useState(versions[1]?.version ?? versions[0]?.version ?? 1);
  const [to, setTo] = useState(versions[0]?.version ?? 1);
  const older = versions.find((v) => v.version === from);
  const newer = versions.find((v) => v.version === to);

  return (
    <div className="space-y-4">
      <div role="region" aria-label="Saved versions" tabIndex={0} className="overflow-x-auto rounded-md border border-rule">
        <table className="w-full min-w-[32rem] border-collapse text-left text-sm">
          <caption className="sr-only">Saved versions, newest first</caption>
          <thead>
            <tr className="border-b border-rule bg-shade">
              <th scope="col" className="px-3 py-2">
                Version
              </th>
              <th scope="col" className="px-3 py-2">
                Saved
              </th>
              <th scope="col" className="px-3 py-2">
                By
              </th>
              <th scope="col" className="px-3 py-2">
                Change note
              </th>
            </tr>
          </thead>
          <tbody>
            {versions.map((v) => (
              <tr key={v.version} className="border-b border-rule align-top last:border-b-0">
                <td className="px-3 py-1.5 font-semibold tabular-nums">{v.version}</td>
                <td className="px-3 py-1.5 whitespace-nowrap tabular-nums">{formatDateTime(v.createdAt)}</td>
                <td className="px-3 py-1.5">{v.createdByName ?? <span className="text-muted">unknown</span>}</td>
                <td className="px-3 py-1.5">{v.changeNote ?? <span className="text-muted">—</span>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      {versions.length < 2 ? (
        <p className="text-sm text-ink-2">Only one version so far. Each save of the plan adds one here.</p>
      ) : (
        <div className="space-y-3">
          <div className="flex flex-wrap items-end gap-3">
            <div>
              <label htmlFor={fromId} className="block text-sm font-semibold">
                Compare version
              </label>
              <select
                id={fromId}
                value={from}
                onChange={(e) => setFrom(Number(e.target.value))}
                className="mt-1 block min-h-10 rounded-md border border-rule-strong bg-sheet px-2 text-sm tabular-nums"
              >
                {versions.map((v) => (
                  <option key={v.version} value={v.version}>
                    {v.version}
                  </option>
                ))}
              </select>
            </div>
            <div>
              <label htmlFor={toId} className="block text-sm font-semibold">
                with version
              </label>
              <select
                id={toId}
                value={to}
                onChange={(e) => setTo(Number(e.target.value))}
                className="mt-1 block min-h-10 rounded-md border border-rule-strong bg-sheet px-2 text-sm tabular-nums"
              >
                {versions.map((v) => (
                  <option key={v.version} value={v.version}>
                    {v.version}
                  </option>
                ))}
              </select>
            </div>
          </div>
          {older && newer && (
            <PlanDiffTable
              caption={`Changes from version ${older.version} to version ${newer.version}`}
              changes={diffPlans(older, newer)}
            />
          )}
        </div>
      )}
    </div>
  );
}
