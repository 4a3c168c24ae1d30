import { useEffect, useState } from 'react';
import { FormAlert, secondaryButton } from '../../../components/form-controls';
import { formMessage } from '../../../lib/form-errors';
import { useDeliveries } from '../api/list-deliveries';
import { useRedeliver } from '../api/redeliver';
import { DeliveryState } from './delivery-state';
import { TableHead } from '../../../components/table-head';
import { EmptyRow } from '../../../components/empty-row';

const PER_PAGE = 10;
const when = (iso: string) => iso.replace('T', ' ').slice(0, 19) + ' UTC';

/**
 * The deliveries of one webhook, newest first, ten a page, each with a Redeliver button. `lastDelivery`
 * (the webhook list's summary of its latest delivery) changing means there is something new to show: the
 * list is read again then, so it never lags behind the summary beside it.
 */
export function DeliveriesTable({ teamId, webhookId, label, lastDelivery }: { teamId: string; webhookId: string; label: string; lastDelivery: string | null }) {
  const [page, setPage] = useState(1);
  const list = useDeliveries(teamId, webhookId, page, PER_PAGE);
  const { refetch } = list;
  useEffect(() => {
    if (lastDelivery) void refetch();
  }, [lastDelivery, refetch]);
  const redeliver = useRedeliver(teamId, webhookId);
  const pages = Math.max(1, Math.ceil((list.data?.total ?? 0) / PER_PAGE));

  return (
    <section aria-label={`Deliveries of ${label}`} className="space-y-3">
      <h3 className="text-base font-semibold">Deliveries of “{label}”</h3>
      {list.isError ? <FormAlert message={formMessage(list.error)} /> : null}
      <FormAlert message={redeliver.isError ? formMessage(redeliver.error) : null} />
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <TableHead columns={['Event', 'State', 'Status', 'Response', 'Attempts', 'Time', { label: 'Actions', hidden: true }]} />
          <tbody className="divide-y divide-grid-minor dark:divide-night-line">
            {(list.data?.deliveries ?? []).map((d) => (
              <tr key={d.id} data-testid={`delivery-${d.id}`}>
                <td className="py-2 pr-3 font-mono text-xs">
                  {d.eventType}
                  {d.redeliveryOf ? <span className="ml-1 font-sans text-ink/60 dark:text-paper/60">(redelivery)</span> : null}
                </td>
                <td className="py-2 pr-3">
                  <DeliveryState d={d} />
                  {d.lastError ? <p className="mt-0.5 max-w-xs text-xs text-ink/70 dark:text-paper/70">{d.lastError}</p> : null}
                </td>
                <td className="py-2 pr-3 font-mono text-xs">{d.lastStatusCode ?? '—'}</td>
                <td className="py-2 pr-3 font-mono text-xs">{d.lastResponseMs === null || d.lastStatusCode === null ? '—' : `${d.lastResponseMs} ms`}</td>
                <td className="py-2 pr-3 font-mono text-xs">
                  {d.attempts} of {d.maxAttempts}
                  {d.nextAttemptAt ? <span className="block font-sans text-ink/60 dark:text-paper/60">next {when(d.nextAttemptAt)}</span> : null}
                </td>
                <td className="py-2 pr-3 font-mono text-xs">{when(d.createdAt)}</td>
                <td className="py-2">
                  <button type="button" className={secondaryButton} disabled={redeliver.isPending} onClick={() => redeliver.mutate(d.id)} aria-label={`Redeliver ${d.eventType} of ${when(d.createdAt)}`}>
                    Redeliver
                  </button>
                </td>
              </tr>
            ))}
            {list.data?.deliveries.length === 0 ? <EmptyRow span={7}>Nothing sent yet. Send a test ping, or wait for the next proposal, review or release.</EmptyRow> : null}
          </tbody>
        </table>
      </div>
      {pages > 1 ? (
        <div className="flex items-center gap-3 text-sm">
          <button type="button" className={secondaryButton} disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
            Newer
          </button>
          <span className="font-mono text-xs">
            page {page} of {pages}
          </span>
          <button type="button" className={secondaryButton} disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
            Older
          </button>
        </div>
      ) : null}
    </section>
  );
}
