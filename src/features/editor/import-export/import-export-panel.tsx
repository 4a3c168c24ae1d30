/**
 * "Import and export" under the toolbar: motion samples (a CSV/JSON file or pasted text) reduced to
 * keys within a tolerance, with samples before, keys after and the largest error shown before the
 * animator takes them; a pasted CSS easing function; a glTF animation channel (./gltf-importer.tsx);
 * and downloads of the curve in every output format of the baker for one target profile. Imports
 * are one undoable edit each. A read-only editor only exports.
 */
import { memo, useState } from 'react';
import type { Profile } from '../../../../shared/bake';
import type { CurveDocument } from '../../../../shared/curve';
import { useEditor, useEditorApi } from '../store/editor-context';
import { fitView } from '../store/view';
import { EXPORT_FORMATS, EXPORT_LABEL, exportCurve, type ExportFormat } from './export-files';
import { importCssEasing, importSamples, parseTolerance, type SamplesImport } from './import-curve';
import { GltfImporter } from './gltf-importer';

const field = 'rounded-sm border border-grid-major bg-card px-1.5 py-0.5 text-sm dark:border-night-line dark:bg-night-card';
const button = 'rounded-sm border border-grid-major bg-card px-2 py-0.5 text-xs font-medium hover:border-ink disabled:opacity-40 dark:border-night-line dark:bg-night-card';
const sci = (x: number) => x.toExponential(2);

function useReplace() {
  const api = useEditorApi();
  return (doc: CurveDocument) => {
    const s = api.getState();
    s.edit(() => doc, [], null);
    s.setView(fitView(doc));
    s.setPlayhead(doc.keys[0].time);
  };
}

// the importers read the document only when a button runs (api.getState()) and subscribe to the value
// unit they show, so a key drag does not re-render them
function SamplesImporter() {
  const api = useEditorApi();
  const unit = useEditor((s) => s.doc.units.value);
  const replace = useReplace();
  const [text, setText] = useState('');
  const [tol, setTol] = useState('0.001');
  const [result, setResult] = useState<SamplesImport | null>(null);
  const fit = () => {
    const t = parseTolerance(tol);
    setResult(t.ok ? importSamples(text, t.value, api.getState().doc) : { ok: false, error: t.error });
  };
  return (
    <fieldset className="grid gap-1.5 rounded-sm border border-grid-minor p-2 dark:border-night-line">
      <legend className="px-1 text-xs font-semibold">Motion samples (CSV “time, value” or JSON)</legend>
      <input type="file" accept=".csv,.json,.txt,text/csv,application/json" aria-label="Samples file" className="text-xs"
        onChange={async (e) => { const f = e.target.files?.[0]; if (f) { setText(await f.text()); setResult(null); } }} />
      <textarea aria-label="Samples" value={text} onChange={(e) => { setText(e.target.value); setResult(null); }} rows={4}
        placeholder={'time,value\n0,0\n0.1,0.3\n…'} className={`${field} font-mono text-xs`} />
      <div className="flex flex-wrap items-center gap-2">
        <label className="text-xs">tolerance <input aria-label="Fit tolerance" value={tol} onChange={(e) => { setTol(e.target.value); setResult(null); }} className={`${field} w-24 font-mono`} /> {unit}</label>
        <button type="button" className={button} disabled={!text.trim()} onClick={fit}>Fit keys</button>
      </div>
      {result && !result.ok && <p role="alert" className="text-xs text-brick">{result.error}</p>}
      {result?.ok && (
        <div className="flex flex-wrap items-center gap-2 text-xs" data-testid="samples-fit">
          <span className="font-mono">{result.samples} samples → {result.keys} keys · max error {sci(result.maxError)} {unit} (tolerance {sci(result.tolerance)})</span>
          <span className={result.withinTolerance ? 'text-moss' : 'text-brick'}>{result.withinTolerance ? 'within tolerance' : 'over tolerance'}</span>
          <button type="button" className={button} onClick={() => replace(result.doc)}>Use these keys</button>
        </div>
      )}
    </fieldset>
  );
}

function CssImporter() {
  const api = useEditorApi();
  const replace = useReplace();
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  return (
    <fieldset className="grid gap-1.5 rounded-sm border border-grid-minor p-2 dark:border-night-line">
      <legend className="px-1 text-xs font-semibold">CSS easing function</legend>
      <div className="flex flex-wrap items-center gap-2">
        <input aria-label="CSS easing" value={text} onChange={(e) => { setText(e.target.value); setError(null); }} placeholder="cubic-bezier(0.25, 0.1, 0.25, 1)"
          className={`${field} min-w-72 font-mono text-xs`} />
        <button type="button" className={button} disabled={!text.trim()} onClick={() => {
          const r = importCssEasing(text, api.getState().doc);
          if (r.ok) { replace(r.doc); setError(null); } else setError(r.error);
        }}>Use this easing</button>
      </div>
      {error && <p role="alert" className="text-xs text-brick">{error}</p>}
    </fieldset>
  );
}

function download(filename: string, mime: string, data: string | Uint8Array) {
  const blob = new Blob([typeof data === 'string' ? data : new Uint8Array(data)], { type: mime });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

function Exporter({ profiles }: { profiles: readonly Profile[] }) {
  const api = useEditorApi();
  const [name, setName] = useState(profiles[0]?.name ?? '');
  const [format, setFormat] = useState<ExportFormat>('json');
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const profile = profiles.find((p) => p.name === name) ?? profiles[0];
  return (
    <fieldset className="grid gap-1.5 rounded-sm border border-grid-minor p-2 dark:border-night-line">
      <legend className="px-1 text-xs font-semibold">Export the baked table</legend>
      <div className="flex flex-wrap items-center gap-2">
        <label className="text-xs">target <select aria-label="Export target" value={profile?.name ?? ''} onChange={(e) => { setName(e.target.value); setNote(null); }} className={field}>
          {profiles.map((p) => <option key={p.name} value={p.name}>{p.name}</option>)}
        </select></label>
        <label className="text-xs">format <select aria-label="Export format" value={format} onChange={(e) => { setFormat(e.target.value as ExportFormat); setNote(null); }} className={field}>
          {EXPORT_FORMATS.map((f) => <option key={f} value={f}>{EXPORT_LABEL[f]}</option>)}
        </select></label>
        <button type="button" className={button} disabled={!profile} onClick={() => {
          if (!profile) return;
          const doc = api.getState().doc;
          const r = exportCurve(doc, profile, format);
          if (!r.ok) { setNote({ ok: false, text: r.error }); return; }
          download(r.filename, r.mime, r.data);
          setNote({ ok: true, text: `${r.filename}: ${r.entries} entries, ${r.bytes} B table, max error ${sci(r.maxError)} ${doc.units.value}` });
        }}>Download</button>
      </div>
      {note && <p role={note.ok ? 'status' : 'alert'} className={`font-mono text-xs ${note.ok ? '' : 'text-brick'}`} data-testid="export-note">{note.text}</p>}
    </fieldset>
  );
}

export const ImportExportPanel = memo(function ImportExportPanel({ profiles }: { profiles: readonly Profile[] }) {
  const readOnly = useEditor((s) => s.readOnly);
  return (
    <details className="rounded-md border border-grid-major bg-card/60 px-2 py-1 dark:border-night-line dark:bg-night-card/60">
      <summary className="cursor-pointer text-sm font-medium">{readOnly ? 'Export' : 'Import and export'}</summary>
      <div className="mt-2 grid gap-2 lg:grid-cols-3">
        {!readOnly && <SamplesImporter />}
        {!readOnly && <CssImporter />}
        {!readOnly && <GltfImporter />}
        <Exporter profiles={profiles} />
      </div>
    </details>
  );
});
