/**
 * The scratch editor: the curve editor over the browser-local document source. Targets are the
 * ones the page passes (the team's target profiles when signed in), else the demo studio's four
 * profiles, labelled "demo targets". Loaded lazily by src/pages/editor-page.tsx (the baker and the
 * curve engine stay out of the main bundle).
 */
import { useMemo } from 'react';
import { DEMO_PROFILES, type Profile } from '../../../../shared/bake';
import { localDocumentSource } from '../store/document-source';
import { DEFAULT_EXAMPLE } from '../store/examples';
import { CurveEditor } from './curve-editor';

export default function ScratchEditor({ profiles, profilesLabel }: { profiles?: readonly Profile[]; profilesLabel?: string }) {
  const source = useMemo(() => localDocumentSource(window.localStorage), []);
  const use = profiles && profiles.length > 0;
  return (
    <CurveEditor source={source} fallback={DEFAULT_EXAMPLE.doc}
      profiles={use ? profiles : DEMO_PROFILES} profilesLabel={use ? (profilesLabel ?? 'team targets') : 'demo targets'} />
  );
}
