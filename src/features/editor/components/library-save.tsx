/**
 * Explicit saving of a library curve: the Save button (and the `save` command, Ctrl+S), the conflict
 * message with Reload and Overwrite when someone saved since this page loaded, the browser-local
 * draft of unsaved edits (kept while editing, restored by CurveEditor after a reload), and the
 * warnings when leaving with unsaved edits (beforeunload for the browser, a router blocker for links).
 * A read-only editor (a viewer) shows none of it but a note.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { useBlocker } from 'react-router-dom';
import { useStore } from 'zustand';
import type { CurveDocument } from '../../../../shared/curve';
import type { CurveDrafts } from '../library-source';
import type { EditorDocumentSource } from '../store/document-source';
import type { EditorStoreApi } from '../store/editor-store';

const DRAFT_DELAY_MS = 200;

type Status =
  | { kind: 'idle' }
  | { kind: 'saving' }
  | { kind: 'saved'; at: Date; revision: number }
  | { kind: 'error'; message: string }
  | { kind: 'conflict'; theirs: CurveDocument; revision: number };

const button = 'rounded-sm border border-grid-major bg-card px-2 py-0.5 text-sm font-medium hover:border-ink disabled:opacity-40 dark:border-night-line dark:bg-night-card';

export function LibrarySavePanel({ api, source, drafts, initialRevision, baseline: initialBaseline }: {
  api: EditorStoreApi; source: EditorDocumentSource; drafts: CurveDrafts; initialRevision: number; baseline: CurveDocument;
}) {
  const revision = useRef(initialRevision);
  const [shownRevision, setShownRevision] = useState(initialRevision);
  const [baseline, setBaseline] = useState(initialBaseline);
  const [status, setStatus] = useState<Status>({ kind: 'idle' });
  const doc = useStore(api, (s) => s.doc);
  const dragging = useStore(api, (s) => s.drag !== null);
  const dirty = doc !== baseline;
  const busy = status.kind === 'saving';

  // the draft follows the document (never mid-drag); back at the stored document it is removed
  useEffect(() => {
    if (dragging) return;
    const t = setTimeout(() => (dirty ? drafts.write(revision.current, doc) : drafts.clear(revision.current)), DRAFT_DELAY_MS);
    return () => clearTimeout(t);
  }, [doc, dirty, dragging, drafts]);
  useEffect(() => {
    const flush = () => { const d = api.getState().doc; if (d !== baseline) drafts.write(revision.current, d); };
    window.addEventListener('pagehide', flush);
    return () => window.removeEventListener('pagehide', flush);
  }, [api, baseline, drafts]);

  const settle = (saved: CurveDocument, rev: number) => {
    drafts.clear(revision.current);
    revision.current = rev;
    setShownRevision(rev);
    setBaseline(saved);
    // edits made while the request ran stay a draft on the new revision
    const now = api.getState().doc;
    if (now !== saved) drafts.write(rev, now);
  };

  const save = useCallback(async () => {
    if (busy) return;
    const mine = api.getState().doc;
    setStatus({ kind: 'saving' });
    try {
      const r = await source.save(mine, revision.current);
      if (r.ok) { settle(mine, r.version); setStatus({ kind: 'saved', at: new Date(), revision: r.version }); }
      else setStatus({ kind: 'conflict', theirs: r.conflict.doc, revision: r.conflict.version });
    } catch (e) {
      setStatus({ kind: 'error', message: (e as Error).message });
    }
    // `settle` is left out of the dependencies on purpose: it reads refs and state setters only
  }, [api, source, busy]);

  const overwrite = async () => {
    const mine = api.getState().doc;
    setStatus({ kind: 'saving' });
    try {
      const r = await source.overwrite(mine);
      settle(mine, r.version);
      setStatus({ kind: 'saved', at: new Date(), revision: r.version });
    } catch (e) {
      setStatus({ kind: 'error', message: (e as Error).message });
    }
  };

  const reload = (theirs: CurveDocument, rev: number) => {
    drafts.clear(revision.current);
    revision.current = rev;
    setShownRevision(rev);
    setBaseline(theirs);
    api.getState().load(theirs);
    setStatus({ kind: 'idle' });
  };

  // the Save command (Ctrl+S) runs this panel's save
  const saveRef = useRef(save);
  saveRef.current = save;
  useEffect(() => {
    api.getState().setSaver(() => void saveRef.current());
    return () => api.getState().setSaver(null);
  }, [api]);

  // leaving with unsaved edits: the browser's own question on reload/close, ours on in-app links
  useEffect(() => {
    if (!dirty) return;
    const warn = (e: BeforeUnloadEvent) => { e.preventDefault(); e.returnValue = ''; };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [dirty]);
  const blocker = useBlocker(({ currentLocation, nextLocation }) => dirty && currentLocation.pathname !== nextLocation.pathname);

  return (
    <div className="grid gap-2">
      <div className="flex flex-wrap items-center gap-3">
        <button type="button" className={dirty ? 'rounded-sm border border-ink bg-ink px-3 py-0.5 text-sm font-medium text-paper disabled:opacity-40 dark:border-paper dark:bg-paper dark:text-ink' : `${button} px-3`} disabled={busy || dragging || !dirty} onClick={() => void save()} data-testid="save-button"
          aria-keyshortcuts="Control+S" title="Save to the library (Ctrl+S)">
          {busy ? 'Saving…' : 'Save'}
        </button>
        <p className="text-xs text-ink/70 dark:text-paper/70" aria-live="polite" data-testid="save-status">
          {status.kind === 'saving' ? 'saving…'
            : status.kind === 'error' ? `not saved: ${status.message}`
            : dirty ? `unsaved edits (kept as a draft in this browser) · revision ${shownRevision}`
            : status.kind === 'saved' ? `saved revision ${status.revision} at ${status.at.toLocaleTimeString()}`
            : `revision ${shownRevision}, no unsaved edits`}
        </p>
      </div>
      {status.kind === 'conflict' && (
        <div role="alert" data-testid="save-conflict" className="flex flex-wrap items-center gap-2 rounded-md border border-amber bg-amber/10 p-2 text-sm">
          <span>
            Not saved: someone else saved this curve since you opened it (it is now at revision {status.revision}).
            Reload to see their curve (your edits are dropped), or overwrite theirs with yours.
          </span>
          <button type="button" className={button} onClick={() => reload(status.theirs, status.revision)}>Reload their curve</button>
          <button type="button" className={button} onClick={() => void overwrite()}>Overwrite with mine</button>
        </div>
      )}
      {blocker.state === 'blocked' && (
        <div role="alertdialog" aria-label="Unsaved edits" className="flex flex-wrap items-center gap-2 rounded-md border border-vermilion bg-card p-2 text-sm dark:bg-night-card">
          <span>This curve has unsaved edits. They stay as a draft in this browser if you leave.</span>
          <button type="button" className={button} onClick={() => blocker.reset()}>Stay here</button>
          <button type="button" className={button} onClick={() => blocker.proceed()}>Leave</button>
        </div>
      )}
    </div>
  );
}
