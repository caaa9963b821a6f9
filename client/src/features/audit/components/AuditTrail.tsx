import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { AuditQuerySchema } from '../../../../../policies/schemas';
import type { AuditEntryDto } from '../../../../../policies/dto';
import { formatDateTime } from '../../../lib/format';
import { Button, buttonClass } from '../../../components/ui/Button';
import { SelectField, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { emptyToUndefined } from '../../../lib/form-values';
import { auditExportHref, useAudit, type AuditFilters } from '../api/get-audit';
import { useVerifyChain } from '../api/verify-chain';
import { auditSentence } from '../../../../../policies/words/audit-sentences';

type Input = z.input<typeof AuditQuerySchema>;
type Output = z.output<typeof AuditQuerySchema>;

export interface AthleteOption {
  id: string;
  name: string;
}

/**
 * The audit trail with its filters, for admins (everything) and clinicians (their athletes' entries;
 * the server decides which). `athletes` fills the athlete filter; `canVerify` offers the chain check.
 */
export function AuditTrail({
  orgId,
  athletes = [],
  canVerify = false,
}: {
  orgId: string;
  athletes?: AthleteOption[];
  canVerify?: boolean;
}) {
  const [filters, setFilters] = useState<AuditFilters>({});
  const audit = useAudit(orgId, filters);
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors },
  } = useForm<Input, unknown, Output>({ resolver: zodResolver(AuditQuerySchema) });

  const onSubmit = handleSubmit(({ athleteId, action, from, to }) => setFilters({ athleteId, action, from, to }));
  const clear = () => {
    reset({ athleteId: undefined, action: undefined, from: undefined, to: undefined });
    setFilters({});
  };

  const entries = audit.data?.pages.flatMap((p) => p.entries) ?? [];
  const filtered = Boolean(filters.athleteId || filters.action || filters.from || filters.to);

  return (
    <div className="space-y-4">
      <form onSubmit={onSubmit} noValidate className="flex flex-wrap items-end gap-3" aria-label="Filter the audit trail">
        {athletes.length > 0 && (
          <SelectField
            label="Athlete"
            className="w-full sm:w-56"
            error={errors.athleteId?.message}
            {...register('athleteId', { setValueAs: emptyToUndefined })}
          >
            <option value="">All athletes</option>
            {athletes.map((a) => (
              <option key={a.id} value={a.id}>
                {a.name}
              </option>
            ))}
          </SelectField>
        )}
        <TextField
          label="Action"
          hint="A code from the details, e.g. plan.revised"
          className="w-full sm:w-56"
          error={errors.action?.message}
          {...register('action', { setValueAs: emptyToUndefined })}
        />
        <TextField
          label="From"
          type="date"
          className="w-full sm:w-44"
          error={errors.from?.message}
          {...register('from', { setValueAs: emptyToUndefined })}
        />
        <TextField
          label="To"
          type="date"
          className="w-full sm:w-44"
          error={errors.to?.message}
          {...register('to', { setValueAs: emptyToUndefined })}
        />
        <div className="flex gap-2">
          <Button type="submit">Apply filters</Button>
          {filtered && (
            <Button variant="secondary" onClick={clear}>
              Clear filters
            </Button>
          )}
        </div>
      </form>

      <div className="flex flex-wrap items-center gap-3">
        <a href={auditExportHref(orgId, filters)} download className={buttonClass('secondary', 'sm')}>
          Download {filtered ? 'these entries' : 'the trail'} as CSV
        </a>
        {canVerify && <ChainCheck orgId={orgId} />}
      </div>

      {audit.isPending ? (
        <Loading what="the audit trail" />
      ) : !audit.data ? (
        <ErrorNotice error={audit.error} />
      ) : (
        <>
          <div role="region" tabIndex={0} aria-label="Audit entries" className="overflow-x-auto rounded-lg border border-rule bg-sheet">
            <table className="w-full min-w-[48rem] border-collapse text-left text-sm">
              <thead>
                <tr className="border-b border-rule bg-shade">
                  <th scope="col" className="px-3 py-2 whitespace-nowrap">
                    When
                  </th>
                  <th scope="col" className="px-3 py-2">
                    What happened
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Athlete
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Details
                  </th>
                </tr>
              </thead>
              <tbody>
                {entries.length === 0 ? (
                  <tr>
                    <td colSpan={4} className="px-3 py-4 text-ink-2">
                      {filtered ? 'No entries match these filters.' : 'Nothing has been recorded yet.'}
                    </td>
                  </tr>
                ) : (
                  entries.map((entry) => <AuditRow key={entry.id} entry={entry} />)
                )}
              </tbody>
            </table>
          </div>
          {audit.hasNextPage && (
            <Button variant="secondary" busy={audit.isFetchingNextPage} onClick={() => void audit.fetchNextPage()}>
              Load older entries
            </Button>
          )}
          {audit.isFetchNextPageError && <ErrorNotice error={audit.error} />}
        </>
      )}
    </div>
  );
}

function AuditRow({ entry }: { entry: AuditEntryDto }) {
  const hasChange = entry.before != null || entry.after != null;
  return (
    <tr className="border-b border-rule align-top last:border-b-0">
      <td className="px-3 py-2 whitespace-nowrap tabular-nums">{formatDateTime(entry.occurredAt)}</td>
      <td className="px-3 py-2">{auditSentence(entry)}</td>
      <td className="px-3 py-2">{entry.athleteName ?? <span className="text-muted">—</span>}</td>
      <td className="px-3 py-2">
        {/* The code, record id and before/after stay available for whoever exports or investigates. */}
        <details>
          <summary className="cursor-pointer">{hasChange ? 'Before and after' : 'Record'}</summary>
          <p className="mt-2 text-xs text-muted">
            <span className="font-mono">{entry.action}</span> · {entry.subjectType}
            {entry.subjectId && <span className="font-mono"> {entry.subjectId.slice(0, 8)}</span>}
          </p>
          {hasChange && (
            <div className="mt-2 grid gap-2 md:grid-cols-2">
              <ChangeBlock title="Before" value={entry.before} />
              <ChangeBlock title="After" value={entry.after} />
            </div>
          )}
        </details>
      </td>
    </tr>
  );
}

/** Verifies every entry of the organization's audit trail (its hash chain) and says plainly what it found. */
function ChainCheck({ orgId }: { orgId: string }) {
  const verify = useVerifyChain(orgId);
  const report = verify.data;
  return (
    <div className="flex flex-wrap items-center gap-3">
      <Button variant="secondary" size="sm" busy={verify.isPending} onClick={() => verify.mutate()}>
        Verify the audit trail
      </Button>
      <div aria-live="polite" className="text-sm">
        {report &&
          (report.intact ? (
            <Notice tone="done" className="py-1.5">
              <p className="tabular-nums">
                The audit trail is intact: {report.entries} {report.entries === 1 ? 'entry' : 'entries'} verified, none changed or missing.
              </p>
            </Notice>
          ) : (
            <Notice tone="problem" className="py-1.5">
              <p className="font-semibold">
                The audit trail is broken at entry #{report.firstBrokenId}: {report.reason}
              </p>
              <p>Entries from there on cannot be trusted as recorded. Export the trail and contact your Loadline operator.</p>
            </Notice>
          ))}
      </div>
      {verify.isError && <ErrorNotice error={verify.error} />}
    </div>
  );
}

function ChangeBlock({ title, value }: { title: string; value: unknown }) {
  return (
    <div>
      <p className="text-xs font-semibold text-muted">{title}</p>
      <pre className="max-w-md overflow-x-auto rounded bg-paper p-2 text-xs whitespace-pre-wrap">
        {value == null ? '—' : JSON.stringify(value, null, 2)}
      </pre>
    </div>
  );
}
