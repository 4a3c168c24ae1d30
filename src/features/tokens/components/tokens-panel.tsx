import { useState, type FormEvent } from 'react';
import { createTokenSchema, splitPackSlugs } from '../../../../shared/schemas/accounts';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { FormAlert, TextField, dangerButton, primaryButton, secondaryButton } from '../../../components/form-controls';
import { useTokens } from '../api/list-tokens';
import { useCreateToken } from '../api/create-token';
import { useRevokeToken } from '../api/revoke-token';
import { TableHead } from '../../../components/table-head';
import { EmptyRow } from '../../../components/empty-row';

const when = (iso: string | null) => (iso ? iso.replace('T', ' ').slice(0, 16) + ' UTC' : '—');

/** Create a read-only service token (its secret is shown once), list and revoke tokens. */
export function TokensPanel({ teamId }: { teamId: string }) {
  const tokens = useTokens(teamId);
  const create = useCreateToken(teamId);
  const revoke = useRevokeToken(teamId);
  const [name, setName] = useState('');
  const [packs, setPacks] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const [secret, setSecret] = useState<{ name: string; value: string } | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    const slugs = splitPackSlugs(packs);
    const checked = checkForm(createTokenSchema, { name, packSlugs: slugs.length ? slugs : undefined });
    if (!checked.ok) return setFields(Object.fromEntries(Object.entries(checked.fields).map(([k, v]) => [k.startsWith('packSlugs') ? 'packSlugs' : k, v])));
    setFields({});
    create.mutate(checked.data, {
      onSuccess: (r) => {
        setSecret({ name: r.token.name, value: r.secret });
        setName('');
        setPacks('');
      },
      onError: (e) => setFields(Object.fromEntries(Object.entries(serverFields(e)).map(([k, v]) => [k.startsWith('packSlugs') ? 'packSlugs' : k, v]))),
    });
  }

  return (
    <div className="space-y-6">
      <form noValidate onSubmit={submit} className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-start" aria-label="Create a service token">
        <TextField id="token-name" label="Name" placeholder="nightly build farm" value={name} onChange={(e) => setName(e.target.value)} error={fields.name} />
        <TextField id="token-packs" label="Only these packs (optional)" placeholder="jump-arcs, camera-moves" value={packs} onChange={(e) => setPacks(e.target.value)} error={fields.packSlugs} hint="Empty: every pack of the team." />
        <button type="submit" disabled={create.isPending} className={`sm:mt-6 ${primaryButton}`}>
          Create token
        </button>
      </form>
      <FormAlert message={create.isError && !Object.keys(fields).length ? formMessage(create.error) : null} />
      {secret ? (
        <div role="status" className="rounded-md border-l-4 border-amber bg-card p-4 dark:bg-night-card">
          <p className="text-sm font-semibold">Copy the secret of “{secret.name}” now — it is shown this once and never again.</p>
          <code data-testid="token-secret" className="mt-2 block break-all rounded bg-paper px-2 py-1 font-mono text-sm dark:bg-night">
            {secret.value}
          </code>
          <p className="mt-2 text-xs">Send it as <code className="font-mono">Authorization: Bearer &lt;secret&gt;</code>. It can read; it can never write.</p>
          <button type="button" className={`mt-2 ${secondaryButton}`} onClick={() => setSecret(null)}>
            I have copied it
          </button>
        </div>
      ) : null}
      {tokens.isError ? <FormAlert message={formMessage(tokens.error)} /> : null}
      <table className="w-full text-left text-sm">
        <TableHead columns={['Name', 'Packs', 'Created', 'Last used', 'State']} />
        <tbody className="divide-y divide-grid-minor dark:divide-night-line">
          {(tokens.data ?? []).map((t) => (
            <tr key={t.id} data-testid={`token-${t.name}`}>
              <td className="py-2 pr-3 font-medium">{t.name}</td>
              <td className="py-2 pr-3 font-mono text-xs">{t.packSlugs ? t.packSlugs.join(', ') : 'every pack'}</td>
              <td className="py-2 pr-3 font-mono text-xs">{when(t.createdAt)}</td>
              <td className="py-2 pr-3 font-mono text-xs">{when(t.lastUsedAt)}</td>
              <td className="py-2">
                {t.revokedAt ? (
                  <span className="text-sm text-brick dark:text-[#e07a6a]">revoked {when(t.revokedAt)}</span>
                ) : confirming === t.id ? (
                  <span className="inline-flex gap-2">
                    <button type="button" className={dangerButton} onClick={() => revoke.mutate(t.id, { onSettled: () => setConfirming(null) })}>
                      Yes, revoke
                    </button>
                    <button type="button" className={secondaryButton} onClick={() => setConfirming(null)}>
                      Keep
                    </button>
                  </span>
                ) : (
                  <button type="button" className={secondaryButton} onClick={() => setConfirming(t.id)} aria-label={`Revoke ${t.name}`}>
                    Revoke
                  </button>
                )}
              </td>
            </tr>
          ))}
          {tokens.data?.length === 0 ? <EmptyRow span={5}>No service tokens yet.</EmptyRow> : null}
        </tbody>
      </table>
    </div>
  );
}
