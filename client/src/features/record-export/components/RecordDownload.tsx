import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { formatDateTime } from '../../../lib/format';
import { useDownloadRecord, useRecordLink } from '../api/record-exports';
import { sizeWords } from './record-words';

/** What an e-mailed link opens to, for the signed-in person who asked: the download, or why there is none. */
export function RecordDownload({ orgId, token }: { orgId: string; token: string }) {
  const link = useRecordLink(orgId, token);
  const download = useDownloadRecord(orgId, token);
  if (link.isPending) return <Loading what="the link" />;
  if (link.error) return <ErrorNotice error={link.error} wording={{ notFound: 'This link does not work for your account.' }} />;
  const d = link.data;
  if (d.state === 'unknown') {
    return (
      <Notice tone="problem" title="This link does not work for your account">
        <p>
          Only the person who asked for the copy can use its link, signed in as themself. Ask for a new copy on your{' '}
          <Link to="/account">account page</Link>.
        </p>
      </Notice>
    );
  }
  if (d.state === 'expired') {
    return (
      <Notice tone="caution" title="This link has expired">
        <p>
          The copy of {d.athleteName}&apos;s record could be downloaded until {formatDateTime(d.expiresAt)}. Ask for a new copy on your{' '}
          <Link to="/account">account page</Link>.
        </p>
      </Notice>
    );
  }
  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-2">
        A ZIP file of {sizeWords(d.sizeBytes)} with {d.athleteName}&apos;s record: data files you can open in any text editor or spreadsheet
        tool, and the letters, documents and clips. The link works until {formatDateTime(d.expiresAt)}.
      </p>
      <Button size="lg" busy={download.isPending} onClick={() => download.mutate()}>
        Download the record
      </Button>
      {download.isSuccess && (
        <Notice tone="done" role="status">
          Downloaded. Keep the file somewhere private: it holds health information.
        </Notice>
      )}
      {download.error ? <ErrorNotice error={download.error} /> : null}
    </div>
  );
}
