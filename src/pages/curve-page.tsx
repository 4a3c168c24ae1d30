import { lazy, Suspense, useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { roleCan } from '../../shared/schemas/roles';
import { useProfiles } from '../features/profiles/api/list-profiles';
import { RequireSignIn } from './require-sign-in';

const LibraryEditor = lazy(() => import('../features/editor/components/library-editor'));

/**
 * /packs/:pack/curves/:curve: the editor on one library curve of the current team. Members with
 * curves.edit save it (explicitly, with revision checks); everyone else gets it read only.
 */
export function CurvePage() {
  const { pack = '', curve = '' } = useParams();
  return (
    <RequireSignIn>
      {({ team }) => (team ? <CurveOfTeam teamId={team.id} teamName={team.name} canEdit={roleCan(team.role, 'curves.edit')} pack={pack} curveId={curve} /> : <p>You are not in a team yet.</p>)}
    </RequireSignIn>
  );
}

function CurveOfTeam({ teamId, teamName, canEdit, pack, curveId }: { teamId: string; teamName: string; canEdit: boolean; pack: string; curveId: string }) {
  const stored = useProfiles(teamId);
  const profiles = useMemo(() => stored.data?.map((p) => p.profile), [stored.data]);
  return (
    // the editor breaks out of the page column: the canvas spans the window's width
    <div className="-mt-4 ml-[calc(50%-50vw+1.5rem)] w-[calc(100vw-3rem)]">
      <title>{`Curve · ${pack} · Tangentry`}</title>
      <p className="mb-2 text-sm"><Link to="/packs" className="underline">Library</Link> / <Link to={`/packs/${encodeURIComponent(pack)}`} className="font-mono underline">{pack}</Link></p>
      <Suspense fallback={<p className="text-sm">Opening the editor…</p>}>
        {stored.isPending ? <p className="text-sm">Reading the team's target profiles…</p> : (
          <LibraryEditor key={`${teamId}/${curveId}`} teamId={teamId} pack={pack} curveId={curveId} canEdit={canEdit}
            profiles={profiles} profilesLabel={`target profiles of ${teamName}`} />
        )}
      </Suspense>
    </div>
  );
}
