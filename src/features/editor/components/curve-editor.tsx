/**
 * The editor, laid out as the brief asks: the canvas across the page, the target strip under it with
 * the motion preview at its right end, the key card floating next to the selected key.
 * The document comes from an EditorDocumentSource and is saved back to it (debounced, never mid-drag).
 */
import { memo, useEffect, useMemo, useRef, useState } from 'react';
import type { Profile } from '../../../../shared/bake';
import type { CurveDocument } from '../../../../shared/curve';
import { CurveCanvas, type OverlayData } from '../canvas/curve-canvas';
import { toX, toY, type Transform } from '../canvas/transform';
import { commandForKey } from '../commands/commands';
import { KeyCard } from '../key-card/key-card';
import { MotionPreview } from '../motion-preview/motion-preview';
import type { EditorDocumentSource } from '../store/document-source';
import { EditorProvider, useEditor, useEditorApi } from '../store/editor-context';
import { createEditorStore, type EditorStoreApi } from '../store/editor-store';
import { EDITOR_EXAMPLES } from '../store/examples';
import { fitView } from '../store/view';
import { createBakeRunner, type BakeRunner } from '../target-strip/bake-runner';
import { TargetStrip } from '../target-strip/target-strip';
import { useStore } from 'zustand';
import type { CurveDrafts } from '../library-source';
import { ImportExportPanel } from '../import-export/import-export-panel';
import { HelpSheet } from './help-sheet';
import { LibrarySavePanel } from './library-save';
import { Toolbar } from './toolbar';

/** Key card width (w-80) and the room kept free around the key for its slope handles. */
const CARD_W = 320;
const CARD_GAP = 56;
const SAVE_DELAY_MS = 250;

function isField(t: EventTarget | null): boolean {
  const el = t as HTMLElement | null;
  return !!el && (el.tagName === 'INPUT' || el.tagName === 'SELECT' || el.tagName === 'TEXTAREA' || el.isContentEditable);
}

/** Shortcuts: one handler over the command list, ignored while typing in a field. */
function useShortcuts(api: EditorStoreApi, root: React.RefObject<HTMLDivElement | null>) {
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (isField(e.target) || e.defaultPrevented) return;
      // inside the editor, or nowhere in particular (the page body)
      const inside = root.current?.contains(e.target as Node) || e.target === document.body;
      if (!inside) return;
      const c = commandForKey(api, e);
      if (!c) return;
      e.preventDefault();
      c.run(api);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [api, root]);
}

/** Save the document to its source after edits settle; report conflicts. */
function useAutosave(api: EditorStoreApi, source: EditorDocumentSource, initialVersion: number | null) {
  const version = useRef(initialVersion);
  const [status, setStatus] = useState<{ kind: 'saved' | 'saving' | 'error'; at?: Date; message?: string } | { kind: 'conflict'; theirs: CurveDocument; version: number }>({ kind: 'saved' });
  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    let lastSaved = api.getState().doc;
    const saveNow = async () => {
      clearTimeout(timer);
      const doc = api.getState().doc;
      if (doc === lastSaved) return;
      setStatus({ kind: 'saving' });
      try {
        const r = await source.save(doc, version.current);
        if (r.ok) { version.current = r.version; lastSaved = doc; setStatus({ kind: 'saved', at: new Date() }); }
        else setStatus({ kind: 'conflict', theirs: r.conflict.doc, version: r.conflict.version });
      } catch (e) {
        setStatus({ kind: 'error', message: (e as Error).message });
      }
    };
    const unsub = api.subscribe((s) => {
      if (s.drag || s.doc === lastSaved) return;
      clearTimeout(timer);
      timer = setTimeout(() => { if (!api.getState().drag) void saveNow(); }, SAVE_DELAY_MS);
    });
    // leaving or hiding the page keeps the newest edit at once (the local source writes synchronously)
    const flush = () => { if (!api.getState().drag) void saveNow(); };
    const hidden = () => { if (document.visibilityState === 'hidden') flush(); };
    window.addEventListener('pagehide', flush);
    document.addEventListener('visibilitychange', hidden);
    return () => {
      unsub(); clearTimeout(timer);
      window.removeEventListener('pagehide', flush);
      document.removeEventListener('visibilitychange', hidden);
    };
  }, [api, source]);
  return {
    status,
    async keepMine() {
      const r = await source.overwrite(api.getState().doc);
      version.current = r.version;
      setStatus({ kind: 'saved', at: new Date() });
    },
    takeTheirs(doc: CurveDocument, v: number) {
      version.current = v;
      api.getState().load(doc);
      setStatus({ kind: 'saved', at: new Date() });
    },
  };
}

function ExampleMenu() {
  const api = useEditorApi();
  return (
    <label className="flex items-center gap-1.5 text-xs">
      <span>Open example</span>
      <select data-testid="example-menu" value="" className="rounded-sm border border-grid-major bg-card px-1 py-0.5 dark:border-night-line dark:bg-night-card"
        onChange={(e) => {
          const ex = EDITOR_EXAMPLES.find((x) => x.id === e.target.value);
          if (!ex) return;
          // an undoable replacement: Undo brings the previous curve back
          api.getState().edit(() => ex.doc, [], null);
          api.getState().setView(fitView(ex.doc));
          api.getState().setPlayhead(ex.doc.keys[0].time);
          api.getState().setPlaying(false);
        }}>
        <option value="">choose…</option>
        {EDITOR_EXAMPLES.map((x) => <option key={x.id} value={x.id}>{x.id} — {x.title}</option>)}
      </select>
    </label>
  );
}

/** The scratch editor's saving: kept in the source after edits settle, with its conflict banner. */
function AutosavePanel({ source, initialVersion }: { source: EditorDocumentSource; initialVersion: number | null }) {
  const api = useEditorApi();
  const save = useAutosave(api, source, initialVersion);
  const st = save.status;
  return (
    <>
      <p className="text-xs text-ink/60 dark:text-paper/60" aria-live="polite" data-testid="save-status">
        {st.kind === 'saving' ? 'keeping…' : st.kind === 'saved' ? (st.at ? `kept at ${st.at.toLocaleTimeString()}` : 'kept in this browser') : st.kind === 'error' ? `not kept: ${st.message}` : ''}
      </p>
      {st.kind === 'conflict' && (
        <div role="alert" className="flex w-full flex-wrap items-center gap-2 rounded-md border border-amber bg-amber/10 p-2 text-sm">
          <span>Another tab changed this scratch curve since you opened it.</span>
          <button type="button" className="rounded-sm border px-2 py-0.5" onClick={() => save.takeTheirs(st.theirs, st.version)}>Load the other tab's curve</button>
          <button type="button" className="rounded-sm border px-2 py-0.5" onClick={() => void save.keepMine()}>Keep mine (overwrite)</button>
        </div>
      )}
    </>
  );
}

/** The key card beside the primary key (a component: it reads the primary key from the store itself). */
function KeyCardSlot({ tf, width }: { tf: Transform; width: number }) {
  const primary = useEditor((s) => s.primary);
  const k = useEditor((s) => (s.primary !== null && s.primary < s.doc.keys.length ? s.doc.keys[s.primary] : null));
  if (primary === null || !k) return null;
  const x = toX(tf, k.time), y = toY(tf, k.value);
  if (x < tf.plot.x - 10 || x > tf.plot.x + tf.plot.w + 10) return null;
  // beside the key, past its handles: right if there is room, else left; below a key in the upper
  // half of the plot and above one in the lower half, so the card never covers the key or its handles
  const left = x + CARD_GAP + CARD_W < width ? x + CARD_GAP : Math.max(0, x - CARD_GAP - CARD_W);
  const upper = y < tf.plot.y + tf.plot.h / 2;
  // above a key the card may not reach past the canvas top (it scrolls inside instead)
  const pos = upper ? { left, top: Math.max(0, y + 16) } : { left, bottom: Math.max(0, tf.plot.y + tf.plot.h + 30 - y + 16), maxHeight: Math.max(160, y - 16) };
  return <KeyCard position={pos} />;
}

// the parts under the body take no props that change in a drag: memoised, a bake landing mid-drag
// re-renders the body without re-rendering them (each subscribes to the store for what it shows)
const ToolbarPart = memo(Toolbar);
const CanvasPart = memo(CurveCanvas);
const TargetStripPart = memo(TargetStrip);
const MotionPreviewPart = memo(MotionPreview);
const HelpSheetPart = memo(HelpSheet);

const placeKeyCard = (tf: Transform, width: number) => <KeyCardSlot tf={tf} width={width} />;

/** How a library curve is saved: explicitly, with drafts; `baseline` is the stored document. */
export interface ExplicitSaving {
  drafts: CurveDrafts;
}

function EditorBody({ source, runner, profiles, profilesLabel, initialVersion, explicit, readOnly }: {
  source: EditorDocumentSource; runner: BakeRunner; profiles: readonly Profile[]; profilesLabel: string; initialVersion: number | null;
  explicit?: ExplicitSaving & { baseline: CurveDocument }; readOnly: boolean;
}) {
  const api = useEditorApi();
  const root = useRef<HTMLDivElement>(null);
  useShortcuts(api, root);
  // the body subscribes only to what it shows itself (a key drag changes the document on every move;
  // the canvas, the key card, the strip and the preview subscribe on their own)
  const docName = useEditor((s) => s.doc.name);
  const overlayName = useEditor((s) => s.overlay);
  const results = useStore(runner.store, (s) => s.results);
  const overlay: OverlayData | null = useMemo(() => {
    const r = overlayName ? results[overlayName] : undefined;
    return r && r.ok ? { name: r.profile, tolerance: r.tolerance, entries: r.entries, dotTimes: r.dotTimes, dotValues: r.dotValues } : null;
  }, [overlayName, results]);
  return (
    <div ref={root} className="grid gap-3" data-testid="curve-editor">
      <header className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h1 className="text-xl font-semibold tracking-tight">
          {source.label}: <span className="font-mono text-lg">{docName}</span>
        </h1>
        <p className="text-sm text-ink/70 dark:text-paper/70">{source.description}</p>
        {readOnly ? (
          <p className="text-xs font-medium" data-testid="read-only-note">Read only: your role in this team can look at curves but not change them.</p>
        ) : explicit ? null : <AutosavePanel source={source} initialVersion={initialVersion} />}
        {explicit ? null : <div className="ml-auto"><ExampleMenu /></div>}
      </header>
      {explicit && !readOnly && initialVersion !== null && (
        <LibrarySavePanel api={api} source={source} drafts={explicit.drafts} initialRevision={initialVersion} baseline={explicit.baseline} />
      )}
      <ToolbarPart />
      <ImportExportPanel profiles={profiles} />
      <CanvasPart overlay={overlay}>{placeKeyCard}</CanvasPart>
      <div className="flex flex-col gap-3 lg:flex-row lg:items-start">
        <TargetStripPart runner={runner} profiles={profiles} profilesLabel={profilesLabel} />
        <MotionPreviewPart />
      </div>
      <HelpSheetPart />
    </div>
  );
}

export interface CurveEditorProps {
  source: EditorDocumentSource;
  /** Used when the source holds nothing yet. */
  fallback: CurveDocument;
  profiles: readonly Profile[];
  /** e.g. "demo targets" until the team's target profiles are wired in. */
  profilesLabel: string;
  /** A library curve: saved with the Save button, unsaved edits kept as drafts. Omitted: saved as you edit. */
  explicit?: ExplicitSaving;
  /** A viewer's editor: nothing can be changed or saved. */
  readOnly?: boolean;
}

export function CurveEditor({ source, fallback, profiles, profilesLabel, explicit, readOnly = false }: CurveEditorProps) {
  const [loaded, setLoaded] = useState<{ store: EditorStoreApi; version: number | null; baseline: CurveDocument; note?: string; failed?: string } | null>(null);
  // the runner owns workers: made and ended by an effect (never in render or a memo), so an effect
  // re-run or a remount never leaves the strip holding a disposed runner
  const [runner, setRunner] = useState<BakeRunner | null>(null);
  useEffect(() => {
    const r = createBakeRunner(profiles);
    setRunner(r);
    return () => { r.dispose(); setRunner(null); };
  }, [profiles]);
  useEffect(() => {
    let live = true;
    void source.load().then((r) => {
      if (!live) return;
      if (r.ok && r.loaded) {
        // a library curve's unsaved edits from an earlier visit, begun from this same revision
        const draft = explicit && !readOnly ? explicit.drafts.read(r.loaded.version) : null;
        setLoaded({
          store: createEditorStore(draft ?? r.loaded.doc, { readOnly }), version: r.loaded.version, baseline: r.loaded.doc,
          note: draft ? 'Your unsaved edits from before were restored from this browser; they are not in the library until you save.' : undefined,
        });
      } else if (explicit) {
        // a library curve that could not be read: nothing to edit (and nothing that could be saved over it)
        setLoaded({ store: createEditorStore(fallback, { readOnly: true }), version: null, baseline: fallback, failed: r.ok ? 'The library returned no curve.' : r.message });
      } else setLoaded({
        store: createEditorStore(fallback, { readOnly }), version: null, baseline: fallback,
        note: r.ok ? undefined : `${r.message} Starting from the example instead${r.issues?.length ? ` (${r.issues[0].message})` : ''}.`,
      });
    }, (e: unknown) => { if (live) setLoaded({ store: createEditorStore(fallback, { readOnly: true }), version: null, baseline: fallback, failed: (e as Error).message }); });
    return () => { live = false; };
  }, [source, fallback, explicit, readOnly]);
  if (loaded?.failed) return <p role="alert" className="rounded-md border border-brick bg-brick/10 p-2 text-sm">Could not open the curve: {loaded.failed}</p>;
  if (!loaded || !runner) return <p className="text-sm">Opening the curve…</p>;
  return (
    <EditorProvider store={loaded.store}>
      {loaded.note && <p role="alert" data-testid="draft-note" className="mb-2 rounded-md border border-amber bg-amber/10 p-2 text-sm">{loaded.note}</p>}
      <EditorBody source={source} runner={runner} profiles={profiles} profilesLabel={profilesLabel} initialVersion={loaded.version}
        explicit={explicit ? { ...explicit, baseline: loaded.baseline } : undefined} readOnly={readOnly} />
    </EditorProvider>
  );
}
