/**
 * Said where the documents are, never behind a click: who sees them, and that Loadline keeps the
 * file without reading it, so nobody takes the upload as a clinician having seen it.
 */
export function DocumentsCaution({ athleteName, audience }: { athleteName: string; audience: 'clinician' | 'athlete' }) {
  return (
    <p className="rounded-md border border-rule border-l-4 border-l-line bg-sheet px-3 py-2 text-sm text-ink-2">
      <span className="font-semibold text-ink">
        {audience === 'athlete'
          ? 'Only you and the clinicians on your care team see these.'
          : `Only the clinicians on ${athleteName}'s care team and ${athleteName} see these.`}
      </span>{' '}
      Coaches and guardians do not. Loadline stores each document as it was sent; it does not read, check or interpret it.
      {audience === 'athlete' && ' Questions about what a document says go to whoever issued it, or to your clinician.'}
    </p>
  );
}
