/**
 * The editor over a library curve: loaded from and saved to the packs API (../library-source.ts),
 * saved with the Save button or Ctrl+S, unsaved edits kept as a draft in this browser. Without the
 * curves.edit permission it is read only and shows no Save. Loaded lazily by src/pages/curve-page.tsx.
 */
import { useMemo } from 'react';
import { DEMO_PROFILES, type Profile } from '../../../../shared/bake';
import { curveDrafts, librarySource } from '../library-source';
import { DEFAULT_EXAMPLE } from '../store/examples';
import { CurveEditor } from './curve-editor';

export default function LibraryEditor({ teamId, pack, curveId, canEdit, profiles, profilesLabel }: {
  teamId: string; pack: string; curveId: string; canEdit: boolean; profiles?: readonly Profile[]; profilesLabel?: string;
}) {
  const source = useMemo(() => librarySource({ teamId, pack, curveId }), [teamId, pack, curveId]);
  const explicit = useMemo(() => ({ drafts: curveDrafts(window.localStorage, curveId) }), [curveId]);
  const use = profiles && profiles.length > 0;
  return (
    <CurveEditor source={source} fallback={DEFAULT_EXAMPLE.doc} explicit={explicit} readOnly={!canEdit}
      profiles={use ? profiles : DEMO_PROFILES} profilesLabel={use ? (profilesLabel ?? 'team targets') : 'demo targets'} />
  );
}
