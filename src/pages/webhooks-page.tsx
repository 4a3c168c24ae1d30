import { Card } from '../components/card';
import { WebhooksPanel } from '../features/webhooks/components/webhooks-panel';
import { roleCan } from '../../shared/schemas/roles';
import { RequireSignIn } from './require-sign-in';
import { TeamNav } from './team-nav';

export function WebhooksPage() {
  return (
    <RequireSignIn>
      {({ team }) =>
        !team ? null : (
          <div>
            <title>{`Webhooks · ${team.name} · Tangentry`}</title>
            <h1 className="text-2xl font-semibold tracking-tight">{team.name}: webhooks</h1>
            <p className="mt-2 max-w-prose text-sm">
              Tangentry POSTs a signed JSON message to each registered URL when a version is proposed, approved or sent back for changes, and when a channel moves.
            </p>
            <TeamNav role={team.role} />
            <Card className="mt-6 p-5">
              {roleCan(team.role, 'webhooks.manage') ? <WebhooksPanel teamId={team.id} /> : <p>Only admins of {team.name} manage webhooks.</p>}
            </Card>
          </div>
        )
      }
    </RequireSignIn>
  );
}
