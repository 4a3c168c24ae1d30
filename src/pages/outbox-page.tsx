import { Card } from '../components/card';
import { FormAlert } from '../components/form-controls';
import { formMessage } from '../lib/form-errors';
import { useOutbox } from '../features/teams/api/get-outbox';
import { RequireSignIn } from './require-sign-in';
import { TeamNav } from './team-nav';

function Messages() {
  const outbox = useOutbox();
  if (outbox.isPending) return <p className="text-sm">Loading…</p>;
  if (outbox.isError) return <FormAlert message={formMessage(outbox.error)} />;
  if (!outbox.data.length) return <p className="text-sm">No messages caught yet.</p>;
  return (
    <ul className="space-y-3">
      {outbox.data.map((m) => (
        <li key={m.id}>
          <Card className="p-4">
            <p className="font-semibold">{m.subject}</p>
            <p className="font-mono text-xs text-ink/65 dark:text-paper/65">
              to {m.to.join(', ')} · {m.receivedAt.replace('T', ' ').slice(0, 19)} UTC
            </p>
            <pre className="mt-2 whitespace-pre-wrap font-sans text-sm">{m.text}</pre>
            {m.links.map((l) => (
              <a key={l} href={l} className="mt-1 block break-all font-mono text-sm text-vermilion underline">
                {l}
              </a>
            ))}
          </Card>
        </li>
      ))}
    </ul>
  );
}

/** Messages the embedded mail catcher caught, so a person trying the demo can follow invitation and reset links. */
export function OutboxPage() {
  return (
    <RequireSignIn>
      {({ team }) => (
        <div>
          <title>Outbox · Tangentry</title>
          <h1 className="text-2xl font-semibold tracking-tight">Outbox</h1>
          <p className="mt-2 max-w-prose text-sm">In the embedded default no mail leaves this machine: the local catcher keeps every message here.</p>
          {team ? <TeamNav role={team.role} /> : null}
          <div className="mt-6">
            <Messages />
          </div>
        </div>
      )}
    </RequireSignIn>
  );
}
