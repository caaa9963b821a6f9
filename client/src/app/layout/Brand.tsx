import { Link } from 'react-router-dom';

/** The wordmark: a bar resting under a marked line, which is what Loadline keeps load doing. */
export function Brand() {
  return (
    <Link to="/" className="inline-flex items-center gap-2 rounded text-lg font-bold no-underline" aria-label="Loadline home">
      <svg width="26" height="26" viewBox="0 0 32 32" aria-hidden="true" focusable="false">
        <rect width="32" height="32" rx="6" fill="#14202e" />
        <rect x="7" y="15" width="14" height="8" fill="#f7f3ec" />
        <rect x="22" y="6" width="2" height="20" fill="#c2571a" />
      </svg>
      <span>Loadline</span>
    </Link>
  );
}
