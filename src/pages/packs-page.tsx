import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { roleCan, type Role } from '../../shared/schemas/roles';
import { Card } from '../components/card';
import { primaryButton } from '../components/form-controls';
import { usePacks } from '../features/packs/api/list-packs';
import { PackCard } from '../features/packs/components/pack-card';
import { PackForm } from '../features/packs/components/pack-form';
import { RequireSignIn } from './require-sign-in';

/** /packs: the current team's library, a grid of pack cards; animators, leads and admins add packs. */
export function PacksPage() {
  return <RequireSignIn>{({ team }) => (team ? <PacksOfTeam teamId={team.id} teamName={team.name} role={team.role} /> : <p>You are not in a team yet.</p>)}</RequireSignIn>;
}

function PacksOfTeam({ teamId, teamName, role }: { teamId: string; teamName: string; role: Role }) {
  const packs = usePacks(teamId);
  const [adding, setAdding] = useState(false);
  const [showArchived, setShowArchived] = useState(false);
  const navigate = useNavigate();
  const canEdit = roleCan(role, 'curves.edit');
  const shown = (packs.data ?? []).filter((p) => showArchived || !p.archived);
  const archivedCount = (packs.data ?? []).filter((p) => p.archived).length;
  return (
    <div>
      <title>{`Library · ${teamName} · Tangentry`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold tracking-tight">{teamName}: library</h1>
          <p className="mt-2 max-w-prose text-sm">Packs of curves. Each pack is versioned as a whole: propose a version, a lead reviews it, a channel releases it.</p>
        </div>
        {canEdit && !adding ? <button type="button" className={primaryButton} onClick={() => setAdding(true)}>New pack</button> : null}
      </div>
      {adding ? (
        <Card className="mt-6 p-5">
          <PackForm teamId={teamId} editing={null} onDone={(p) => navigate(`/packs/${p.slug}`)} />
        </Card>
      ) : null}
      {packs.isPending ? <p className="mt-6">Loading packs…</p> : packs.isError ? <p role="alert" className="mt-6">Could not load the packs: {packs.error.message}</p> : (
        <>
          {shown.length === 0 ? <p className="mt-6">No packs yet.{canEdit ? ' Start one with “New pack”.' : ''}</p> : null}
          <ul aria-label="Packs" className="mt-6 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            {shown.map((p) => <li key={p.id} className="grid"><PackCard pack={p} /></li>)}
          </ul>
          {archivedCount ? (
            <label className="mt-4 flex items-center gap-2 text-sm">
              <input type="checkbox" checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} /> Show {archivedCount} archived {archivedCount === 1 ? 'pack' : 'packs'}
            </label>
          ) : null}
        </>
      )}
    </div>
  );
}
