import type { PainReportDetailDto } from '../../../../../policies/dto';
import { BODY_REGION_LABELS } from '../../../../../policies/body-regions';
import { PATTERN_LABELS } from '../../../../../policies/load/patterns';
import { Facts, Panel } from '../../../components/ui/Panel';
import { SeverityMark } from '../../../components/ui/SeverityMark';
import { formatDate } from '../../../lib/format';
import { ROUTE_OUTCOME, answerRows, toldWords } from './report-reading';

/**
 * A pain report as filed. The note and the warning-sign answers appear only when the server sent them
 * (the athlete and their clinicians); a coach's copy has neither, and the page says so.
 */
export function PainReportDetails({ detail }: { detail: PainReportDetailDto }) {
  const { report, told } = detail;
  const answers = report.redFlags ? answerRows(report.redFlags) : null;
  const yesCount = answers?.filter((a) => a.yes).length ?? 0;

  return (
    <div className="space-y-4">
      <Panel title="What the app did">
        <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
          <SeverityMark severity={report.route} />
        </p>
        <p className="mt-2 max-w-prose text-sm">{ROUTE_OUTCOME[report.route]}</p>
        <h3 className="mt-3 text-sm font-semibold">Who was told</h3>
        {told.length === 0 ? (
          <p className="text-sm text-muted">Nobody was sent a notice with this report.</p>
        ) : (
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-sm">
            {told.map((t, i) => (
              <li key={`${t.kind}-${i}`} className="break-words">
                <span className="font-semibold">{t.name}</span>, {toldWords(t)}
              </li>
            ))}
          </ul>
        )}
      </Panel>

      {answers ? (
        <Panel title="Warning-sign answers">
          <p className="text-sm tabular-nums">
            {yesCount === 0 ? `No to all ${answers.length} questions.` : `Yes to ${yesCount} of ${answers.length} questions.`}
          </p>
          <ol className="mt-2 max-w-3xl divide-y divide-rule border-y border-rule text-sm">
            {answers.map((a) => (
              <li key={a.id} className="flex items-start justify-between gap-3 py-2">
                <span className="min-w-0 break-words">{a.question}</span>
                <span className={a.yes ? 'shrink-0 font-bold whitespace-nowrap text-line-deep' : 'shrink-0 whitespace-nowrap text-ink-2'}>
                  {a.yes && <span aria-hidden="true">▲ </span>}
                  {a.yes ? 'Yes' : 'No'}
                </span>
              </li>
            ))}
          </ol>
        </Panel>
      ) : null}

      <Panel title="The pain">
        <Facts
          items={[
            { label: 'Where', value: report.bodyRegions.map((r) => BODY_REGION_LABELS[r] ?? r).join(', ') },
            { label: 'Pain now', value: `${report.painNow}/10` },
            { label: 'Worst in 24 hours', value: `${report.painWorst24h}/10` },
            { label: 'Began on', value: formatDate(report.onsetDate) },
            { label: 'How it started', value: report.startedInTraining ? 'During training' : 'Outside training' },
            {
              label: 'Worse with',
              value: report.aggravatingPatterns.length
                ? report.aggravatingPatterns.map((p) => PATTERN_LABELS[p as keyof typeof PATTERN_LABELS] ?? p).join(', ')
                : 'nothing named',
            },
          ]}
        />
      </Panel>

      {'note' in report ? (
        <Panel title="In the athlete’s words">
          {report.note ? (
            <p className="max-w-prose text-sm break-words whitespace-pre-line">{report.note}</p>
          ) : (
            <p className="text-sm text-muted">No note was added.</p>
          )}
        </Panel>
      ) : null}

      {!answers && !('note' in report) && (
        <p className="max-w-prose text-sm text-ink-2">
          The athlete’s note and warning-sign answers are for their clinicians only. Ask a clinician on the care team if you need to know
          more.
        </p>
      )}
    </div>
  );
}
