import { useState, type FormEvent } from 'react';
import { WEBHOOK_EVENTS, WEBHOOK_EVENT_LABEL, createWebhookSchema, type WebhookEvent, type WebhookPolicyDto } from '../../../../shared/schemas/webhooks';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { FieldError, FormAlert, TextField, primaryButton } from '../../../components/form-controls';
import { useCreateWebhook } from '../api/create-webhook';

const eventsKey = (k: string) => (k.startsWith('events') ? 'events' : k);

/** Register a webhook: URL, the events it wants, a description. The new secret goes to `onCreated`. */
export function WebhookForm({ teamId, policy, onCreated }: { teamId: string; policy: WebhookPolicyDto | undefined; onCreated: (label: string, secret: string) => void }) {
  const create = useCreateWebhook(teamId);
  const [url, setUrl] = useState('');
  const [description, setDescription] = useState('');
  const [events, setEvents] = useState<WebhookEvent[]>([...WEBHOOK_EVENTS]);
  const [fields, setFields] = useState<FieldErrors>({});

  function submit(event: FormEvent) {
    event.preventDefault();
    const checked = checkForm(createWebhookSchema, { url, description, events });
    if (!checked.ok) return setFields(Object.fromEntries(Object.entries(checked.fields).map(([k, v]) => [eventsKey(k), v])));
    setFields({});
    create.mutate(checked.data, {
      onSuccess: (r) => {
        onCreated(r.webhook.description || r.webhook.url, r.secret);
        setUrl('');
        setDescription('');
        setEvents([...WEBHOOK_EVENTS]);
      },
      onError: (e) => setFields(Object.fromEntries(Object.entries(serverFields(e)).map(([k, v]) => [eventsKey(k), v]))),
    });
  }

  const toggle = (e: WebhookEvent) => setEvents((list) => (list.includes(e) ? list.filter((x) => x !== e) : [...list, e]));
  const placeholder = policy?.httpsOnly === false ? 'http://127.0.0.1:8080/tangentry' : 'https://builds.example.test/hooks/tangentry';

  return (
    <form noValidate onSubmit={submit} aria-label="Register a webhook" className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          id="webhook-url"
          label="Receiver URL"
          placeholder={placeholder}
          value={url}
          onChange={(e) => setUrl(e.target.value)}
          error={fields.url}
          hint={
            policy?.httpsOnly === false
              ? 'This server also allows http:// and loopback or private addresses (WEBHOOK_ALLOW_PRIVATE_TARGETS).'
              : 'https:// only, to a public address: loopback and private addresses are refused on this server.'
          }
        />
        <TextField id="webhook-description" label="Description (optional)" placeholder="nightly build farm" value={description} onChange={(e) => setDescription(e.target.value)} error={fields.description} />
      </div>
      <fieldset aria-describedby={fields.events ? 'webhook-events-error' : undefined}>
        <legend className="text-sm font-medium">Events</legend>
        <div className="mt-1 flex flex-wrap gap-x-5 gap-y-1">
          {WEBHOOK_EVENTS.map((e) => (
            <label key={e} className="inline-flex items-center gap-2 text-sm">
              <input type="checkbox" checked={events.includes(e)} onChange={() => toggle(e)} className="accent-vermilion" />
              {WEBHOOK_EVENT_LABEL[e]} <code className="font-mono text-xs text-ink/60 dark:text-paper/60">{e}</code>
            </label>
          ))}
        </div>
        <FieldError id="webhook-events-error" message={fields.events} />
      </fieldset>
      <FormAlert message={create.isError && !Object.keys(fields).length ? formMessage(create.error) : null} />
      <button type="submit" disabled={create.isPending} className={primaryButton}>
        Register webhook
      </button>
    </form>
  );
}
