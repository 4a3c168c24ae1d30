/**
 * "glTF animation" in the import panel: read a .gltf or .glb, choose a channel and (for vector and
 * quaternion outputs) a component, see keys before and after reduction with the largest error, and
 * use it as the curve's keys — one undoable edit, like the other imports.
 */
import { useState } from 'react';
import { useEditor, useEditorApi } from '../store/editor-context';
import { fitView } from '../store/view';
import { parseTolerance } from './import-curve';
import { importGltfComponent, readGltfChannels, type GltfChannelsResult, type GltfComponentImport } from './gltf-import';

const field = 'rounded-sm border border-grid-major bg-card px-1.5 py-0.5 text-sm dark:border-night-line dark:bg-night-card';
const button = 'rounded-sm border border-grid-major bg-card px-2 py-0.5 text-xs font-medium hover:border-ink disabled:opacity-40 dark:border-night-line dark:bg-night-card';
const sci = (x: number) => x.toExponential(2);

/** The file's bytes (Blob.arrayBuffer where there is one, FileReader otherwise). */
function bytesOf(file: Blob): Promise<Uint8Array> {
  if (typeof file.arrayBuffer === 'function') return file.arrayBuffer().then((b) => new Uint8Array(b));
  return new Promise((resolve, reject) => {
    const r = new FileReader();
    r.onload = () => resolve(new Uint8Array(r.result as ArrayBuffer));
    r.onerror = () => reject(r.error ?? new Error('could not read the file'));
    r.readAsArrayBuffer(file);
  });
}

export function GltfImporter() {
  // the document is read when Fit runs; only the unit is shown (a key drag does not re-render this)
  const unit = useEditor((s) => s.doc.units.value);
  const api = useEditorApi();
  const [read, setRead] = useState<GltfChannelsResult | null>(null);
  const [channel, setChannel] = useState(0);
  const [component, setComponent] = useState(0);
  const [tol, setTol] = useState('0.001');
  const [result, setResult] = useState<GltfComponentImport | null>(null);
  const channels = read?.ok ? read.channels : [];
  const ch = channels[channel];
  const reduce = () => {
    const t = parseTolerance(tol);
    const comp = ch?.components[component];
    if (!comp) return;
    setResult(t.ok ? importGltfComponent(comp, t.value, api.getState().doc) : { ok: false, error: t.error });
  };
  const use = (next: GltfComponentImport & { ok: true }) => {
    const s = api.getState();
    s.edit(() => next.doc, [], null);
    s.setView(fitView(next.doc));
    s.setPlayhead(next.doc.keys[0].time);
  };
  return (
    <fieldset className="grid gap-1.5 rounded-sm border border-grid-minor p-2 dark:border-night-line">
      <legend className="px-1 text-xs font-semibold">glTF animation (.gltf, .glb)</legend>
      <input type="file" accept=".gltf,.glb,model/gltf+json,model/gltf-binary" aria-label="glTF file" className="text-xs"
        onChange={async (e) => {
          const f = e.target.files?.[0];
          if (!f) return;
          setRead(readGltfChannels(await bytesOf(f)));
          setChannel(0); setComponent(0); setResult(null);
        }} />
      {read && !read.ok && <p role="alert" className="text-xs text-brick">{read.error}</p>}
      {ch && (
        <div className="flex flex-wrap items-center gap-2">
          <label className="text-xs">channel <select aria-label="glTF channel" value={channel} className={field}
            onChange={(e) => { setChannel(Number(e.target.value)); setComponent(0); setResult(null); }}>
            {channels.map((c, i) => <option key={`${i}-${c.label}`} value={i}>{c.label} · {c.interpolation} · {c.keys} keys</option>)}
          </select></label>
          {ch.components.length > 1 && (
            <label className="text-xs">component <select aria-label="glTF component" value={component} className={field}
              onChange={(e) => { setComponent(Number(e.target.value)); setResult(null); }}>
              {ch.components.map((c, i) => <option key={c.label} value={i}>{c.label}</option>)}
            </select></label>
          )}
          <label className="text-xs">tolerance <input aria-label="glTF tolerance" value={tol} className={`${field} w-24 font-mono`}
            onChange={(e) => { setTol(e.target.value); setResult(null); }} /> {unit}</label>
          <button type="button" className={button} onClick={reduce}>Reduce keys</button>
        </div>
      )}
      {read?.ok && read.warnings.length > 0 && <ul className="text-xs text-amber">{read.warnings.map((w) => <li key={w}>note: {w}</li>)}</ul>}
      {result && !result.ok && <p role="alert" className="text-xs text-brick">{result.error}</p>}
      {result?.ok && (
        <div className="flex flex-wrap items-center gap-2 text-xs" data-testid="gltf-fit">
          <span className="font-mono">{result.keysBefore} keys → {result.keysAfter} keys · max error {result.reduced ? sci(result.maxError) : '0'} {unit} (tolerance {sci(result.tolerance)})</span>
          <span>{result.reduced ? `within tolerance${result.note !== 'reduced' ? ` · ${result.note}` : ''}` : result.note}</span>
          <button type="button" className={button} onClick={() => use(result)}>Use this channel</button>
        </div>
      )}
    </fieldset>
  );
}
