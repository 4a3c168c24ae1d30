import { Link } from 'react-router-dom';
import { UserMenu } from '../../features/auth/components/user-menu';
import { TeamSwitcher } from '../../features/teams/components/team-switcher';
import { NoticesIndicator } from '../../features/notifications/components/notices-indicator';
import { useCurrentTeam } from '../use-current-team';

/**
 * The right-hand end of the top bar: the team switcher and the person's menu when signed in,
 * the sign-in link otherwise (also while /api/auth/me is unanswered or fails).
 */
export function TopBarAccountSlot() {
  const { me, teams, team, setTeamId } = useCurrentTeam();
  const user = me.data?.user;
  return (
    <div className="flex items-center gap-3" data-slot="account">
      {user ? (
        <>
          <NoticesIndicator onFollow={(n) => setTeamId(n.team.id)} />
          <TeamSwitcher teams={teams} currentId={team?.id ?? null} onChange={setTeamId} />
          <UserMenu name={user.name} />
        </>
      ) : (
        <Link
          to="/sign-in"
          className="rounded border border-ink/30 px-3 py-1.5 text-sm font-medium hover:border-ink hover:bg-card motion-safe:transition-colors dark:border-paper/30 dark:hover:border-paper dark:hover:bg-night-card"
        >
          Sign in
        </Link>
      )}
    </div>
  );
}
