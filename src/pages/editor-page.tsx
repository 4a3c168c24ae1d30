import { lazy, Suspense } from 'react';

const ScratchEditor = lazy(() => import('../features/editor/components/scratch-editor'));

/**
 * /editor: the scratch curve, kept in this browser's local storage until the library can store
 * curves. Targets are the demo studio's four profiles until the team's own are available.
 */
export function EditorPage() {
  return (
    // the editor breaks out of the page column: the canvas spans the window's width
    <div className="-mt-4 ml-[calc(50%-50vw+1.5rem)] w-[calc(100vw-3rem)]">
      <title>Scratch curve · Tangentry</title>
      <Suspense fallback={<p className="text-sm">Opening the editor…</p>}>
        <ScratchEditor />
      </Suspense>
    </div>
  );
}
