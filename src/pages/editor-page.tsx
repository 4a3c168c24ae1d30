import { lazy, Suspense, useMemo } from 'react';
import { useCurrentTeam } from '../app/use-current-team';
import { useProfiles } from '../features/profiles/api/list-profiles';

const ScratchEditor = lazy(() => import('../features/editor/components/scratch-editor'));

/**
 * /editor: the scratch curve, kept in this browser's local storage until the library stores curves.
 * Open to everyone. Signed in with a team that has target profiles, the target strip uses them;
 * otherwise the demo studio's four profiles ("demo targets").
 */
export function EditorPage() {
  const { team } = useCurrentTeam();
  const stored = useProfiles(team?.id);
  const profiles = useMemo(() => stored.data?.map((p) => p.profile), [stored.data]);
  // wait for the team's profiles (if any) so the strip does not bake the demo targets first
  const waiting = !!team && stored.isPending;
  return (
    // the editor breaks out of the page column: the canvas spans the window's width
    <div className="-mt-4 ml-[calc(50%-50vw+1.5rem)] w-[calc(100vw-3rem)]">
      <title>Scratch curve · Tangentry</title>
      <Suspense fallback={<p className="text-sm">Opening the editor…</p>}>
        {waiting ? <p className="text-sm">Reading the team's target profiles…</p> : (
          <ScratchEditor profiles={profiles} profilesLabel={team ? `target profiles of ${team.name}` : undefined} />
        )}
      </Suspense>
    </div>
  );
}
