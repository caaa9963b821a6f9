import { useId, useState } from 'react';
import type { RosterPreviewDto, RosterPreviewRowDto } from '../../../../../policies/dto';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Facts } from '../../../components/ui/Panel';
import { OUTCOME_WORDS, problemSentence, rowsWord } from './roster-words';

type Show = 'problems' | 'all';

/**
 * The checked file before anything is written: how many rows are new, already here or have problems,
 * each row with its problems in words (or what importing it would do), and the import button. The
 * server imports the rows without problems and leaves the others out, so the button names how many
 * rows it imports, and the page says how to bring the rest: fix them and upload the file again.
 */
export function RosterPreview({
  preview,
  onImport,
  importing,
  error,
}: {
  preview: RosterPreviewDto;
  onImport: () => void;
  importing: boolean;
  error: unknown;
}) {
  const { counts } = preview;
  const importable = counts.rows - counts.skip;
  const [show, setShow] = useState<Show>(counts.skip > 0 ? 'problems' : 'all');
  const rows = show === 'all' ? preview.rows : preview.rows.filter((r) => r.problems.length > 0);
  const groupName = useId();

  return (
    <div className="space-y-4">
      <div data-testid="roster-counts">
        <Facts
          items={[
            { label: 'Rows in the file', value: counts.rows.toLocaleString('en-US') },
            { label: 'New athletes', value: counts.create.toLocaleString('en-US') },
            { label: 'Already here, with something to add', value: counts.update.toLocaleString('en-US') },
            { label: 'Already here, unchanged', value: counts.unchanged.toLocaleString('en-US') },
            { label: 'With problems', value: counts.skip.toLocaleString('en-US') },
          ]}
        />
      </div>
      {counts.skip > 0 && (
        <Notice tone="caution" title={`${rowsWord(counts.skip)} ${counts.skip === 1 ? 'has' : 'have'} problems and will be left out`}>
          <p>
            Fix them in your spreadsheet and upload the whole file again: the rows already imported are matched by e-mail and stay as they
            are.
          </p>
        </Notice>
      )}
      <fieldset className="flex flex-wrap gap-4 text-sm">
        <legend className="sr-only">Rows to show</legend>
        {(
          [
            ['problems', `Rows with problems (${counts.skip.toLocaleString('en-US')})`],
            ['all', `All rows (${counts.rows.toLocaleString('en-US')})`],
          ] as const
        ).map(([value, label]) => (
          <label key={value} className="flex items-center gap-2">
            <input type="radio" name={groupName} value={value} checked={show === value} onChange={() => setShow(value)} />
            {label}
          </label>
        ))}
      </fieldset>
      <PreviewTable rows={rows} />
      <ErrorNotice error={error} title="The import did not start" />
      <div className="flex flex-wrap items-center gap-3">
        <Button onClick={onImport} busy={importing} disabled={importable === 0}>
          Import {rowsWord(importable)}
        </Button>
        {importable === 0 && <p className="text-sm text-muted">Every row has a problem: fix the file and upload it again.</p>}
      </div>
    </div>
  );
}

function PreviewTable({ rows }: { rows: RosterPreviewRowDto[] }) {
  const captionId = useId();
  if (rows.length === 0) return <p className="text-sm text-muted">No row has a problem.</p>;
  return (
    <div role="region" aria-labelledby={captionId} tabIndex={0} className="overflow-x-auto rounded-md border border-rule">
      <table className="w-full min-w-[48rem] text-left text-sm">
        <caption id={captionId} className="sr-only">
          The file&apos;s rows, checked
        </caption>
        <thead className="bg-shade">
          <tr>
            <th scope="col" className="px-3 py-2">
              Line
            </th>
            <th scope="col" className="px-3 py-2">
              Name
            </th>
            <th scope="col" className="px-3 py-2">
              E-mail
            </th>
            <th scope="col" className="px-3 py-2">
              Outcome
            </th>
            <th scope="col" className="px-3 py-2">
              Problems, or what importing does
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const outcome = OUTCOME_WORDS[r.outcome];
            return (
              <tr key={r.line} data-testid={`roster-row-${r.line}`} className="border-t border-rule align-top">
                <td className="px-3 py-2 tabular-nums">{r.line}</td>
                <td className="px-3 py-2">{r.name}</td>
                <td className="px-3 py-2 break-all">{r.email}</td>
                <td className="px-3 py-2">
                  <span aria-hidden="true" className="mr-1 font-bold">
                    {outcome.glyph}
                  </span>
                  {outcome.word}
                </td>
                <td className="px-3 py-2">
                  {r.problems.length > 0 ? (
                    <ul className="space-y-0.5 font-semibold text-line-deep">
                      {r.problems.map((p, i) => (
                        <li key={`${p.field}-${i}`}>{problemSentence(p)}</li>
                      ))}
                    </ul>
                  ) : (
                    <ul className="space-y-0.5 text-ink-2">
                      {r.does.length > 0 ? (
                        r.does.map((d) => <li key={d}>{d[0].toUpperCase() + d.slice(1)}.</li>)
                      ) : (
                        <li>Nothing to change.</li>
                      )}
                    </ul>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
