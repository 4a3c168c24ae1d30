import { useState, type FormEvent } from 'react';
import { channelNameSchema } from '../../../../shared/schemas/channels';
import type { VersionDto } from '../../../../shared/schemas/versions';
import { FormAlert, SelectField, TextField, inputClass, primaryButton } from '../../../components/form-controls';
import { formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { useChannels, useRelease } from '../api/channels';

/** The pack's channels and their release history; leads move a channel to an approved version (or back). */
export function ChannelsPanel({ teamId, slug, versions, canRelease }: { teamId: string; slug: string; versions: VersionDto[]; canRelease: boolean }) {
  const channels = useChannels(teamId, slug);
  const release = useRelease(teamId, slug);
  const approved = versions.filter((v) => v.state === 'approved');
  const [name, setName] = useState('shipping');
  const [version, setVersion] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  function submit(e: FormEvent) {
    e.preventDefault();
    const n = channelNameSchema.safeParse(name.trim());
    if (!n.success) return setFields({ channel: n.error.issues[0]!.message });
    const chosen = Number(version || approved[0]?.number);
    if (!Number.isSafeInteger(chosen)) return setFields({ version: 'version: choose an approved version' });
    setFields({});
    release.mutate({ channel: n.data, version: chosen }, { onError: (err) => setFields(serverFields(err)) });
  }
  return (
    <div className="space-y-3 text-sm">
      {channels.isPending ? <p>Loading channels…</p> : channels.isError ? <p role="alert">Could not load channels: {channels.error.message}</p> : channels.data.length === 0 ? <p>No channels yet.</p> : (
        <ul aria-label="Channels" className="space-y-2">
          {channels.data.map((c) => (
            <li key={c.name}>
              <p><span className="font-mono font-semibold">{c.name}</span> → <span className="font-mono">v{c.version}</span></p>
              <ol aria-label={`Releases of ${c.name}`} className="ml-4 list-disc text-xs text-ink/75 dark:text-paper/75">
                {c.history.map((m) => (
                  <li key={m.at + m.to}>{m.from === null ? `created at v${m.to}` : `v${m.from} → v${m.to}`} by {m.by?.name ?? 'someone'} · <time dateTime={m.at}>{new Date(m.at).toLocaleString()}</time></li>
                ))}
              </ol>
            </li>
          ))}
        </ul>
      )}
      {canRelease ? (
        approved.length === 0 ? <p>Approve a version to release it on a channel.</p> : (
          <form onSubmit={submit} noValidate aria-label="Release" className="grid items-end gap-3 sm:grid-cols-[1fr_1fr_auto]">
            <TextField id="release-channel" label="Channel" value={name} onChange={(e) => setName(e.target.value)} error={fields.channel} list="channel-names" className={`${inputClass} font-mono`} />
            <datalist id="channel-names"><option value="shipping" /><option value="nightly" /></datalist>
            <SelectField id="release-version" label="Approved version" value={version || String(approved[0]!.number)} onChange={(e) => setVersion(e.target.value)} error={fields.version}>
              {approved.map((v) => <option key={v.id} value={v.number}>v{v.number}: {v.changelog.slice(0, 60)}</option>)}
            </SelectField>
            <button type="submit" className={primaryButton} disabled={release.isPending}>{release.isPending ? 'Releasing…' : 'Release'}</button>
            <div className="sm:col-span-3"><FormAlert message={release.isError && !Object.keys(serverFields(release.error)).length ? formMessage(release.error) : null} /></div>
          </form>
        )
      ) : null}
    </div>
  );
}
