/**
 * Shapes on a segment: a palette that previews every easing family (a sparkline of f on [0, 1],
 * drawn by the curve engine's shapeValue), and the conversion of a shape or bezier segment to
 * editable hermite keys within a chosen tolerance (shared/convert fitCurve, key reduction),
 * reporting how many keys it took and the largest error found.
 */
import { useMemo, useState } from 'react';
import { prepareCurve, shapeValue, SHAPE_FAMILIES, type CurveDocument, type Shape, type ShapeEase, type ShapeFamily } from '../../../../shared/curve';
import { fitCurve } from '../../../../shared/convert';
import { useEditorApi } from '../store/editor-context';
import { settle } from '../store/edits';
import { sci } from '../target-strip/verdict';
import { parseNumberField } from './validate-edit';

const W = 44, H = 26, N = 32;

/** Path data of f over [0, 1] in a W × H box, scaled to the shape's own min/max (overshoot shows). */
export function sparkline(shape: Shape, duration: number): string {
  const ys = new Float64Array(N + 1);
  let lo = 0, hi = 1;
  for (let j = 0; j <= N; j++) {
    const y = shapeValue(shape, j / N, 0, duration);
    ys[j] = y;
    if (y < lo) lo = y;
    if (y > hi) hi = y;
  }
  let d = '';
  for (let j = 0; j <= N; j++) d += `${j ? 'L' : 'M'}${((j / N) * (W - 4) + 2).toFixed(1)},${(H - 2 - ((ys[j] - lo) / (hi - lo)) * (H - 4)).toFixed(1)}`;
  return d;
}

export function ConvertNoteLine({ note }: { note: ConvertNote | null }) {
  if (!note) return null;
  return <p role="status" data-testid="convert-note" className={`col-span-2 text-xs ${note.ok ? '' : 'text-brick'}`}>{note.text}</p>;
}

export function ShapePalette({ doc, i, ease, onPick }: { doc: CurveDocument; i: number; ease: ShapeEase; onPick: (s: Shape) => void }) {
  const duration = doc.keys[i + 1].time - doc.keys[i].time;
  const current = doc.segments[i].shape?.family;
  const paths = useMemo(() => SHAPE_FAMILIES.map((f) => sparkline({ family: f, ease }, duration > 0 ? duration : 1)), [ease, duration]);
  return (
    <div className="col-span-2" role="group" aria-label="Shape palette">
      <div className="grid grid-cols-6 gap-1">
        {SHAPE_FAMILIES.map((f, k) => (
          <button key={f} type="button" title={`${f} ${ease}`} aria-pressed={current === f} data-testid={`shape-${f}`}
            onClick={() => onPick({ family: f as ShapeFamily, ease })}
            className={`rounded-sm border p-0.5 ${current === f ? 'border-vermilion' : 'border-grid-major dark:border-night-line'}`}>
            <svg viewBox={`0 0 ${W} ${H}`} className="h-6 w-full" aria-hidden="true">
              <path d={paths[k]} fill="none" strokeWidth={1.3} className="stroke-ink dark:stroke-paper" />
            </svg>
            <span className="block text-[9px] leading-tight">{f}</span>
          </button>
        ))}
      </div>
    </div>
  );
}

/** Replace segment i's shape or Bézier by hermite keys within a tolerance (value units). */
export interface ConvertNote { ok: boolean; text: string }

/** The result note is kept by the card (this control goes away once the segment is hermite). */
export function ConvertToKeys({ doc, i, defaultTolerance, setNote }: {
  doc: CurveDocument; i: number; defaultTolerance: number; setNote: (n: ConvertNote | null) => void;
}) {
  const api = useEditorApi();
  const [text, setText] = useState(String(defaultTolerance));
  const run = () => {
    const n = parseNumberField(text, 'tolerance');
    if (!n.ok || !(n.value > 0)) { setNote({ ok: false, text: n.ok ? 'tolerance must be greater than 0' : n.error }); return; }
    const r = fitCurve(prepareCurve(doc), n.value, [i]);
    const took = r.keysAdded + 2;
    setNote({
      ok: r.ok,
      text: `${r.ok ? 'took' : 'best fit took'} ${took} keys (${r.keysAdded} added), largest error ${sci(r.maxError)} ${doc.units.value}` +
        (r.ok ? '' : ` — above ${sci(n.value)}; not applied`),
    });
    if (r.ok) api.getState().edit(() => settle(r.doc), [i], i);
  };
  return (
    <div className="col-span-2 flex flex-wrap items-end gap-2">
      <label className="text-[11px] text-ink/70 dark:text-paper/70">tolerance
        <input value={text} onChange={(e) => setText(e.target.value)} data-testid="convert-tolerance" inputMode="decimal"
          className="mt-0.5 block w-24 rounded-sm border border-grid-major bg-card px-1.5 py-0.5 font-mono text-sm dark:border-night-line dark:bg-night" />
      </label>
      <button type="button" onClick={run} data-testid="convert-to-keys"
        className="rounded-sm border border-grid-major px-2 py-1 text-xs font-medium dark:border-night-line">Convert to hermite keys</button>
    </div>
  );
}
