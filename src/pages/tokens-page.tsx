import { Card } from '../components/card';
import { TokensPanel } from '../features/tokens/components/tokens-panel';
import { roleCan } from '../../shared/schemas/roles';
import { RequireSignIn } from './require-sign-in';
import { TeamNav } from './team-nav';

export function TokensPage() {
  return (
    <RequireSignIn>
      {({ team }) =>
        !team ? null : (
          <div>
            <title>{`Service tokens · ${team.name} · Tangentry`}</title>
            <h1 className="text-2xl font-semibold tracking-tight">{team.name}: service tokens</h1>
            <p className="mt-2 max-w-prose text-sm">Build servers pull tables with a read-only token. Only a hash of each secret is kept.</p>
            <TeamNav role={team.role} />
            <Card className="mt-6 p-5">
              {roleCan(team.role, 'tokens.manage') ? <TokensPanel teamId={team.id} /> : <p>Only admins of {team.name} manage service tokens.</p>}
            </Card>
          </div>
        )
      }
    </RequireSignIn>
  );
}
