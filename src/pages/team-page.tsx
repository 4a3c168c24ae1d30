import { Card } from '../components/card';
import { MembersTable } from '../features/teams/components/members-table';
import { InviteForm } from '../features/teams/components/invite-form';
import { InvitationsList } from '../features/teams/components/invitations-list';
import { PERMISSIONS, ROLE_LABEL, ROLE_SUMMARY, roleCan, type Permission } from '../../shared/schemas/roles';
import { RequireSignIn } from './require-sign-in';
import { TeamNav } from './team-nav';

const ABILITY: Partial<Record<Permission, string>> = {
  'members.manage': 'manage members and roles',
  'tokens.manage': 'create and revoke service tokens',
  'curves.edit': 'edit curves',
  'versions.propose': 'propose pack versions',
  'versions.review': 'review and approve versions',
  'channels.release': 'release channels',
  'profiles.edit': 'edit target profiles',
  'artifacts.download': 'download tables',
};

export function TeamPage() {
  return (
    <RequireSignIn>
      {({ me, team }) =>
        !team ? (
          <p>You are not in any team yet. An admin can invite you.</p>
        ) : (
          <div>
            <title>{`${team.name} · Tangentry`}</title>
            <p className="text-sm text-ink/65 dark:text-paper/65">{team.studioName}</p>
            <h1 className="text-2xl font-semibold tracking-tight">{team.name}</h1>
            <p className="mt-2" data-testid="my-role">
              You are <strong>{ROLE_LABEL[team.role]}</strong> in {team.name}: {ROLE_SUMMARY[team.role]}.
            </p>
            <ul className="mt-2 flex flex-wrap gap-2 text-xs" aria-label="What your role can do">
              {(Object.keys(ABILITY) as Permission[]).map((p) => {
                const yes = roleCan(team.role, p);
                return (
                  <li key={p} className={`rounded-full border px-2 py-0.5 ${yes ? 'border-moss/50 text-moss dark:text-[#7fbf8e]' : 'border-grid-major text-ink/50 line-through dark:text-paper/50'}`} title={`${PERMISSIONS[p].join(', ')}`}>
                    {yes ? 'can' : 'cannot'} {ABILITY[p]}
                  </li>
                );
              })}
            </ul>
            <TeamNav role={team.role} />
            <div className="mt-6 grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
              <Card className="p-5">
                <h2 className="text-lg font-semibold">Members</h2>
                <MembersTable teamId={team.id} canManage={roleCan(team.role, 'members.manage')} myUserId={me.user.id} />
              </Card>
              {roleCan(team.role, 'invitations.manage') ? (
                <Card className="p-5">
                  <h2 className="text-lg font-semibold">Invite someone</h2>
                  <div className="mt-3">
                    <InviteForm teamId={team.id} teamName={team.name} />
                  </div>
                  <h3 className="mt-6 text-sm font-semibold">Open invitations</h3>
                  <InvitationsList teamId={team.id} />
                </Card>
              ) : null}
            </div>
          </div>
        )
      }
    </RequireSignIn>
  );
}
