import { useState } from 'react';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Panel } from '../../../components/ui/Panel';
import { useRecordExports, useRequestRecordExport } from '../api/record-exports';
import { stateWords } from './record-words';

/**
 * "Download my record" on the account page: the athlete's own record, and for a guardian each minor
 * linked to them, with the state of the latest copy asked for. The copy is prepared in the background
 * and e-mailed as a link for the person who asked only.
 */
export function RecordExportPanel({ orgId }: { orgId: string }) {
  const list = useRecordExports(orgId);
  const ask = useRequestRecordExport(orgId);
  const [askedFor, setAskedFor] = useState<string | null>(null);
  const data = list.data;
  if (!data || data.people.length === 0) return null;

  return (
    <Panel title="Your records">
      <p className="mb-3 text-sm text-ink-2">
        Download a copy of everything this organization keeps in Loadline that you may see: reports, check-ins, training, programs, limits,
        letters, documents and clips. We prepare it in the background and e-mail you a link that works for 7 days, for you only.
      </p>
      <ul className="space-y-4">
        {data.people.map((p) => {
          const latest = data.requests.find((r) => r.athleteId === p.athleteId);
          const state = latest ? stateWords(latest) : null;
          const label = p.self ? 'Download my record' : `Download ${p.athleteName}'s record`;
          return (
            <li key={p.athleteId} className="space-y-2">
              <div className="flex flex-wrap items-center gap-3">
                <Button
                  variant="secondary"
                  busy={ask.isPending && askedFor === p.athleteId}
                  disabled={latest?.state === 'preparing'}
                  onClick={() => {
                    setAskedFor(p.athleteId);
                    ask.mutate(p.athleteId);
                  }}
                >
                  {label}
                </Button>
                {state && (
                  <span className="text-sm" data-testid={`record-state-${p.athleteId}`}>
                    <span className="font-semibold">{state.word}</span> · {state.sentence}
                  </span>
                )}
              </div>
              {askedFor === p.athleteId && ask.error ? <ErrorNotice error={ask.error} /> : null}
            </li>
          );
        })}
      </ul>
      {ask.isSuccess && (
        <Notice tone="done" role="status" className="mt-3">
          Asked. Look for an e-mail from Loadline in a few minutes.
        </Notice>
      )}
    </Panel>
  );
}
