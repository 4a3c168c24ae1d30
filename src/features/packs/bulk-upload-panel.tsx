/**
 * "Upload curve files" on the pack page: pick or drop many CSV / JSON / .gltf / .glb files, send them in
 * one request with a progress bar, then one line per file — the curves it became (name, keys, largest
 * error) or, in words, why it was not stored. Files over the size limit or over the count are named
 * before anything is sent (the server checks again).
 */
import { useId, useState, type DragEvent } from 'react';
import { Card } from '../../components/card';
import { FormAlert, inputClass, primaryButton, secondaryButton } from '../../components/form-controls';
import { formMessage } from '../../lib/form-errors';
import { UPLOAD_DEFAULT_TOLERANCE, UPLOAD_EXTENSIONS, UPLOAD_LIMITS, extensionOf, isUploadExtension, type UploadFileResult } from '../../../shared/schemas/uploads';
import { useBulkUpload } from './bulk-upload-hook';

const kb = (n: number) => (n < 1024 * 1024 ? `${Math.max(1, Math.round(n / 1024))} KB` : `${(n / (1024 * 1024)).toFixed(2)} MB`);
const sci = (x: number) => x.toExponential(2);

/** What is wrong with the chosen files before sending, in words (null when they may go). */
export function checkChosen(files: readonly { name: string; size: number }[]): string | null {
  if (files.length > UPLOAD_LIMITS.files) return `At most ${UPLOAD_LIMITS.files} files in one upload; ${files.length} are chosen.`;
  const big = files.find((f) => f.size > UPLOAD_LIMITS.fileSize);
  if (big) return `“${big.name}” is ${kb(big.size)}, over the ${kb(UPLOAD_LIMITS.fileSize)} limit per file.`;
  return null;
}

function ResultLine({ r }: { r: UploadFileResult }) {
  return (
    <li className="border-t border-grid-minor py-2 first:border-t-0 dark:border-night-line">
      <p className="text-sm"><span className="font-mono">{r.file}</span>{' '}
        {r.ok
          ? <span className="font-medium text-moss dark:text-[#7fbf8e]">stored, {r.curves.length} {r.curves.length === 1 ? 'curve' : 'curves'}</span>
          : <span className="font-medium text-brick dark:text-[#e07a6a]">not stored</span>}
      </p>
      {r.ok ? (
        <ul className="mt-1 grid gap-0.5 pl-4 font-mono text-xs">
          {r.curves.map((c) => (
            <li key={c.id}>{c.name} · {c.keys} keys · max error {c.maxError === 0 ? '0 (as in the file)' : sci(c.maxError)}</li>
          ))}
          {r.warnings?.map((w) => <li key={w} className="font-sans text-amber">note: {w}</li>)}
        </ul>
      ) : (
        <p className="mt-1 pl-4 text-sm">{r.error}{r.field !== 'files' ? <span className="font-mono text-xs"> ({r.field})</span> : null}</p>
      )}
    </li>
  );
}

export function BulkUploadPanel({ teamId, slug }: { teamId: string; slug: string }) {
  const id = useId();
  const { state, start, reset } = useBulkUpload(teamId, slug);
  const [files, setFiles] = useState<File[]>([]);
  const [tolerance, setTolerance] = useState(String(UPLOAD_DEFAULT_TOLERANCE));
  const [over, setOver] = useState(false);
  const busy = state.phase === 'sending' || state.phase === 'processing';
  const problem = checkChosen(files);
  const choose = (list: FileList | null) => { if (list) { setFiles(Array.from(list)); if (!busy) reset(); } };
  const onDrop = (e: DragEvent) => { e.preventDefault(); setOver(false); choose(e.dataTransfer.files); };
  const percent = state.total ? Math.round((100 * state.sent) / state.total) : state.phase === 'processing' ? 100 : 0;
  const okCount = state.results?.filter((r) => r.ok).length ?? 0;
  return (
    <Card className="mt-6 p-5">
      <h2 id={`${id}-h`} className="text-lg font-semibold">Upload curve files</h2>
      <p className="mt-1 text-sm">
        Many files at once: CSV or JSON motion samples (reduced to keys within the tolerance), Tangentry curve documents (.json, taken as they are),
        and glTF animations (.gltf, .glb: one curve per channel component). Up to {UPLOAD_LIMITS.files} files of {kb(UPLOAD_LIMITS.fileSize)} each.
        A name already in the pack gets a number added (fade-2).
      </p>
      <form aria-labelledby={`${id}-h`} className="mt-3 space-y-3" onSubmit={(e) => { e.preventDefault(); if (files.length && !problem) start(files, tolerance); }}>
        <div
          data-testid="upload-drop-zone"
          onDragOver={(e) => { e.preventDefault(); setOver(true); }}
          onDragLeave={() => setOver(false)}
          onDrop={onDrop}
          className={`rounded border-2 border-dashed px-4 py-5 text-center text-sm ${over ? 'border-vermilion bg-paper dark:bg-night' : 'border-grid-major dark:border-night-line'}`}
        >
          <p>Drop files here, or</p>
          <label className={`${secondaryButton} mt-2 inline-block cursor-pointer focus-within:outline focus-within:outline-2 focus-within:outline-vermilion`}>
            choose files
            <input type="file" multiple accept={UPLOAD_EXTENSIONS.join(',')} aria-label="Curve files" className="sr-only" disabled={busy}
              onChange={(e) => choose(e.target.files)} />
          </label>
        </div>
        {files.length ? (
          <ul aria-label="Chosen files" className="grid gap-0.5 font-mono text-xs">
            {files.map((f) => (
              <li key={`${f.name}-${f.size}`}>{f.name} · {kb(f.size)}{isUploadExtension(extensionOf(f.name)) ? '' : ' · not an accepted kind (the server will say so)'}</li>
            ))}
          </ul>
        ) : null}
        <div className="flex flex-wrap items-end gap-3">
          <label className="text-sm font-medium">Tolerance for samples (value units)
            <input className={`${inputClass} w-40 font-mono`} value={tolerance} onChange={(e) => setTolerance(e.target.value)} aria-invalid={state.error?.fields?.tolerance ? true : undefined} />
          </label>
          <button type="submit" className={primaryButton} disabled={busy || files.length === 0 || problem !== null}>
            {busy ? 'Uploading…' : files.length ? `Upload ${files.length} ${files.length === 1 ? 'file' : 'files'}` : 'Upload'}
          </button>
        </div>
        <FormAlert message={problem ?? (state.error ? formMessage(state.error) : null)} />
      </form>
      {state.phase !== 'idle' && state.phase !== 'failed' ? (
        <div className="mt-3">
          <div role="progressbar" aria-label="Upload progress" aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent}
            aria-valuetext={state.phase === 'sending' ? `${percent}% sent` : state.phase === 'processing' ? 'sent; converting and storing' : 'done'}
            className="h-2 w-full overflow-hidden rounded bg-grid-minor dark:bg-night-line">
            <div className="h-full bg-ink transition-[width] dark:bg-paper" style={{ width: `${percent}%` }} />
          </div>
          <p className="mt-1 font-mono text-xs" role="status">
            {state.phase === 'sending' ? `${percent}% sent${state.total ? ` of ${kb(state.total)}` : ''}` : state.phase === 'processing' ? 'Sent; converting and storing…' : `${okCount} of ${state.results?.length ?? 0} files stored.`}
          </p>
        </div>
      ) : null}
      {state.results ? (
        <ul aria-label="Upload results" className="mt-2">
          {state.results.map((r, i) => <ResultLine key={`${i}-${r.file}`} r={r} />)}
        </ul>
      ) : null}
    </Card>
  );
}
