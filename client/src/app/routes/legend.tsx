import { LineBar } from '../../components/ui/LineBar';
import { StatusMark } from '../../components/ui/StatusMark';

/** Shows staff how status and limits will be drawn once cases and plans exist. Marked as an example. */
export function MarksLegend() {
  return (
    <div className="mt-3 grid gap-4 sm:grid-cols-2">
      <div>
        <p className="text-sm font-semibold">Participation status reads as a word and a shape</p>
        <ul className="mt-2 flex flex-wrap gap-4">
          <li>
            <StatusMark status="out" />
          </li>
          <li>
            <StatusMark status="limited" />
          </li>
          <li>
            <StatusMark status="full" />
          </li>
        </ul>
      </div>
      <div>
        <p className="text-sm font-semibold">A cap is a line the bar must stay under</p>
        <LineBar className="mt-2" label="Example: a planned 70 kg against a 60 kg cap" value={70} limit={60} max={90} unit="kg" />
      </div>
    </div>
  );
}
