import { useState } from 'react';
import { Card } from '../components/card';
import { roleCan } from '../../shared/schemas/roles';
import type { StoredProfileDto } from '../../shared/schemas/profiles';
import { ProfilesTable } from '../features/profiles/components/profiles-table';
import { ProfileForm } from '../features/profiles/components/profile-form';
import { useProfiles } from '../features/profiles/api/list-profiles';
import { primaryButton } from '../components/form-controls';
import { RequireSignIn } from './require-sign-in';
import { TeamNav } from './team-nav';

/** Target profiles of the current team: every member reads; engineers and admins add, edit and delete. */
export function ProfilesPage() {
  return <RequireSignIn>{({ team }) => (team ? <ProfilesForTeam teamId={team.id} teamName={team.name} role={team.role} /> : null)}</RequireSignIn>;
}

function ProfilesForTeam({ teamId, teamName, role }: { teamId: string; teamName: string; role: Parameters<typeof roleCan>[0] }) {
  const profiles = useProfiles(teamId);
  const [editing, setEditing] = useState<StoredProfileDto | 'new' | null>(null);
  const canEdit = roleCan(role, 'profiles.edit');
  return (
    <div>
      <title>{`Target profiles · ${teamName} · Tangentry`}</title>
      <h1 className="text-2xl font-semibold tracking-tight">{teamName}: target profiles</h1>
      <p className="mt-2 max-w-prose text-sm">
        Each target platform gets its own table of every curve: the smallest one whose error stays within the tolerance, encoding round-off included.
      </p>
      <TeamNav role={role} />
      <Card className="mt-6 p-5">
        {profiles.isPending ? <p>Loading target profiles…</p> : profiles.isError ? <p role="alert">Could not load the target profiles: {profiles.error.message}</p> : (
          <ProfilesTable teamId={teamId} profiles={profiles.data} canEdit={canEdit} onEdit={(p) => setEditing(p)} />
        )}
        {canEdit && editing === null ? (
          <button type="button" className={`${primaryButton} mt-4`} onClick={() => setEditing('new')}>
            New target profile
          </button>
        ) : null}
        {!canEdit ? <p className="mt-4 text-sm text-ink/70 dark:text-paper/70">Engineers and admins of {teamName} edit target profiles.</p> : null}
      </Card>
      {canEdit && editing !== null ? (
        <Card className="mt-6 p-5">
          <ProfileForm key={editing === 'new' ? 'new' : editing.id} teamId={teamId} editing={editing === 'new' ? null : editing} onDone={() => setEditing(null)} />
        </Card>
      ) : null}
    </div>
  );
}
