import { ROSTER_COLUMNS } from '../../../../../policies/roster';
import { buttonClass } from '../../../components/ui/Button';
import { rosterTemplateHref } from '../api/roster-imports';
import { COLUMN_WORDS } from './roster-words';

/** What the file holds, column by column, and the template to start from (served by the server). */
export function RosterColumns({ orgId }: { orgId: string }) {
  return (
    <div className="space-y-3 text-sm">
      <p>
        One row per athlete, with this header row. Only <code>name</code> and <code>email</code> are required; leave a cell empty when you
        do not know it.
      </p>
      {/* Two columns wrap to a phone's width: no sideways scroll needed. */}
      <div>
        <table className="w-full text-left">
          <thead>
            <tr className="border-b border-rule">
              <th scope="col" className="py-1 pr-4">
                Column
              </th>
              <th scope="col" className="py-1">
                What goes in it
              </th>
            </tr>
          </thead>
          <tbody>
            {ROSTER_COLUMNS.map((c) => (
              <tr key={c} className="border-b border-rule align-top">
                <td className="py-1 pr-3">
                  <code className="break-all">{c}</code>
                </td>
                <td className="py-1">
                  <span className="font-semibold">{COLUMN_WORDS[c].label}.</span> {COLUMN_WORDS[c].says}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <a href={rosterTemplateHref(orgId)} download className={buttonClass('secondary')}>
        Download the template
      </a>
    </div>
  );
}
