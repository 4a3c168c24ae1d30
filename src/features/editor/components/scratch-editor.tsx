/**
 * The scratch editor: the curve editor over the browser-local document source and the demo
 * studio's target profiles ("demo targets") until the team's own profiles can be read.
 * Loaded lazily by src/pages/editor-page.tsx (the baker and curve engine stay out of the main bundle).
 */
import { useMemo } from 'react';
import { DEMO_PROFILES } from '../../../../shared/bake';
import { localDocumentSource } from '../store/document-source';
import { DEFAULT_EXAMPLE } from '../store/examples';
import { CurveEditor } from './curve-editor';

export default function ScratchEditor() {
  const source = useMemo(() => localDocumentSource(window.localStorage), []);
  return <CurveEditor source={source} fallback={DEFAULT_EXAMPLE.doc} profiles={DEMO_PROFILES} profilesLabel="demo targets" />;
}
