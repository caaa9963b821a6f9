import { createColumnHelper } from '@tanstack/react-table';
import type { DeliveryDto } from '../../../../../policies/dto';
import { DataTable } from '../../../components/ui/DataTable';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useDeliveries } from '../api/get-deliveries';

const column = createColumnHelper<DeliveryDto>();

const STATUS_WORDS: Record<DeliveryDto['status'], string> = {
  queued: 'Waiting to send',
  sending: 'Sending',
  sent: 'Sent',
  failed: 'Failed',
};

const columns = [
  column.accessor('createdAt', {
    header: 'Queued',
    cell: (c) => <span className="tabular-nums">{c.getValue().slice(0, 16).replace('T', ' ')} UTC</span>,
  }),
  column.accessor('to', { header: 'To' }),
  column.accessor('subject', { header: 'Subject' }),
  column.accessor('status', {
    header: 'State',
    cell: (c) => {
      const d = c.row.original;
      return (
        <span>
          <strong>{STATUS_WORDS[d.status]}</strong>
          {d.attempts > 1 && <span className="tabular-nums"> · {d.attempts} tries</span>}
          {d.lastError && d.status !== 'sent' && <span className="block text-sm">Reason: {d.lastError}</span>}
        </span>
      );
    },
  }),
];

/** Every e-mail the organization sent or tried to send: failures stay visible with their reason. */
export function DeliveryTable({ orgId }: { orgId: string }) {
  const deliveries = useDeliveries(orgId);
  if (deliveries.isError) return <ErrorNotice error={deliveries.error} />;
  if (!deliveries.data) return <p>Loading deliveries…</p>;
  return (
    <DataTable
      data={deliveries.data}
      columns={columns}
      caption="E-mail deliveries"
      getRowId={(d) => d.id}
      filter={{ label: 'Filter deliveries', text: (d) => `${d.to} ${d.subject} ${STATUS_WORDS[d.status]}` }}
      empty="No e-mail has been sent yet."
      noun={{ one: 'e-mail', many: 'e-mails' }}
      minWidthClass="min-w-[48rem]"
    />
  );
}
