import { useState } from 'react';
import { WEBHOOK_EVENT_LABEL } from '../../../../shared/schemas/webhooks';
import { FormAlert, dangerButton, secondaryButton } from '../../../components/form-controls';
import { StatusWord } from '../../../components/status-word';
import { formMessage } from '../../../lib/form-errors';
import { useWebhooks } from '../api/list-webhooks';
import { useUpdateWebhook } from '../api/update-webhook';
import { useDeleteWebhook } from '../api/delete-webhook';
import { useRotateSecret } from '../api/rotate-secret';
import { useSendPing } from '../api/send-ping';
import { DeliveriesTable } from './deliveries-table';
import { DeliveryState } from './delivery-state';
import { SecretNotice } from './secret-notice';
import { WebhookForm } from './webhook-form';
import { TableHead } from '../../../components/table-head';
import { EmptyRow } from '../../../components/empty-row';

const when = (iso: string) => iso.replace('T', ' ').slice(0, 16) + ' UTC';

/** Register webhooks (the secret is shown once), list them, ping, pause, rotate, delete, and read their deliveries. */
export function WebhooksPanel({ teamId }: { teamId: string }) {
  const list = useWebhooks(teamId);
  const update = useUpdateWebhook(teamId);
  const remove = useDeleteWebhook(teamId);
  const rotate = useRotateSecret(teamId);
  const ping = useSendPing(teamId);
  const [secret, setSecret] = useState<{ label: string; value: string } | null>(null);
  const [selected, setSelected] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<{ id: string; what: 'delete' | 'rotate' } | null>(null);
  const hooks = list.data?.webhooks ?? [];
  const shown = hooks.find((w) => w.id === selected) ?? null;
  const policy = list.data?.policy;
  const failed = update.error ?? remove.error ?? rotate.error ?? ping.error;

  return (
    <div className="space-y-6">
      <WebhookForm teamId={teamId} policy={policy} onCreated={(label, value) => setSecret({ label, value })} />
      {secret ? <SecretNotice label={secret.label} secret={secret.value} onDone={() => setSecret(null)} /> : null}
      {list.isError ? <FormAlert message={formMessage(list.error)} /> : null}
      <FormAlert message={failed ? formMessage(failed) : null} />
      {policy ? (
        <p className="text-xs text-ink/70 dark:text-paper/70">
          A delivery that does not get a 2xx answer within <span className="font-mono">{policy.timeoutMs / 1000} s</span> is tried again after{' '}
          <span className="font-mono">{policy.retryScheduleSeconds.map((s) => (s >= 3600 ? `${s / 3600} h` : s >= 60 ? `${s / 60} min` : `${s} s`)).join(', ')}</span>, then marked failed.
        </p>
      ) : null}
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <TableHead columns={['Receiver', 'Events', 'State', 'Last delivery', { label: 'Actions', hidden: true }]} />
          <tbody className="divide-y divide-grid-minor dark:divide-night-line">
            {hooks.map((w) => {
              const label = w.description || w.url;
              return (
                <tr key={w.id} data-testid="webhook-row" className={selected === w.id ? 'bg-paper/70 dark:bg-night/60' : undefined}>
                  <td className="py-2 pr-3">
                    {w.description ? <span className="block font-medium">{w.description}</span> : null}
                    <span className="break-all font-mono text-xs">{w.url}</span>
                    <span className="block text-xs text-ink/60 dark:text-paper/60">created {when(w.createdAt)}{w.secretRotatedAt ? ` · secret rotated ${when(w.secretRotatedAt)}` : ''}</span>
                  </td>
                  <td className="py-2 pr-3 text-xs">{w.events.map((e) => WEBHOOK_EVENT_LABEL[e]).join(', ')}</td>
                  <td className="py-2 pr-3">{w.active ? <StatusWord tone="pass">on</StatusWord> : <StatusWord tone="neutral">off</StatusWord>}</td>
                  <td className="py-2 pr-3 text-xs">
                    {w.lastDelivery ? (
                      <span className="inline-flex flex-col items-start gap-0.5">
                        <DeliveryState d={w.lastDelivery} />
                        <span className="font-mono">{w.lastDelivery.statusCode ?? '—'} · {when(w.lastDelivery.at)}</span>
                      </span>
                    ) : (
                      'none yet'
                    )}
                  </td>
                  <td className="py-2">
                    <div className="flex flex-wrap gap-2">
                      <button type="button" className={secondaryButton} onClick={() => setSelected(selected === w.id ? null : w.id)} aria-expanded={selected === w.id} aria-label={`Deliveries of ${label}`}>
                        {selected === w.id ? 'Hide deliveries' : 'Deliveries'}
                      </button>
                      <button type="button" className={secondaryButton} disabled={!w.active || ping.isPending} onClick={() => { setSelected(w.id); ping.mutate(w.id); }} aria-label={`Send a test ping to ${label}`}>
                        Send test ping
                      </button>
                      <button type="button" className={secondaryButton} onClick={() => update.mutate({ id: w.id, body: { active: !w.active } })} aria-label={`${w.active ? 'Turn off' : 'Turn on'} ${label}`}>
                        {w.active ? 'Turn off' : 'Turn on'}
                      </button>
                      {confirming?.id === w.id ? (
                        <span className="inline-flex gap-2">
                          <button
                            type="button"
                            className={dangerButton}
                            onClick={() =>
                              confirming.what === 'delete'
                                ? remove.mutate(w.id, { onSettled: () => { setConfirming(null); if (selected === w.id) setSelected(null); } })
                                : rotate.mutate(w.id, { onSuccess: (r) => setSecret({ label, value: r.secret }), onSettled: () => setConfirming(null) })
                            }
                          >
                            {confirming.what === 'delete' ? 'Yes, delete' : 'Yes, new secret'}
                          </button>
                          <button type="button" className={secondaryButton} onClick={() => setConfirming(null)}>
                            Keep
                          </button>
                        </span>
                      ) : (
                        <>
                          <button type="button" className={secondaryButton} onClick={() => setConfirming({ id: w.id, what: 'rotate' })} aria-label={`Rotate the secret of ${label}`}>
                            Rotate secret
                          </button>
                          <button type="button" className={dangerButton} onClick={() => setConfirming({ id: w.id, what: 'delete' })} aria-label={`Delete ${label}`}>
                            Delete
                          </button>
                        </>
                      )}
                    </div>
                  </td>
                </tr>
              );
            })}
            {list.data && hooks.length === 0 ? <EmptyRow span={5}>No webhooks yet.</EmptyRow> : null}
          </tbody>
        </table>
      </div>
      {shown ? <DeliveriesTable teamId={teamId} webhookId={shown.id} label={shown.description || shown.url} lastDelivery={shown.lastDelivery ? `${shown.lastDelivery.at}/${shown.lastDelivery.state}/${shown.lastDelivery.attempts}` : null} /> : null}
    </div>
  );
}
