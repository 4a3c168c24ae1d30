/**
 * The curve canvas (SVG). Thin: it reads the store, builds the screen transform, and hands drawing
 * to the layers (./layers.tsx) and pointer work to ./use-canvas-gestures.ts.
 */
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { evaluateMany, prepareCurve } from '../../../../shared/curve';
import { useEditor, useEditorApi } from '../store/editor-context';
import { addKeyAt } from '../store/edits';
import { snapTime } from '../store/snap';
import { CurveLayer, GridLayer, HandlesLayer, KeysLayer, OverlayLayer, ScrubLine, type KeyView } from './layers';
import { makeTransform, plotFor, toT, type Transform } from './transform';
import { useCanvasGestures, type BoxRect } from './use-canvas-gestures';

export interface OverlayData {
  name: string;
  tolerance: number;
  entries: number;
  dotTimes: Float64Array;
  dotValues: Float64Array;
}

export function CurveCanvas({ height = 440, overlay, children }: {
  height?: number;
  overlay: OverlayData | null;
  /** Floating content positioned over the canvas (the key card), given the transform. */
  children?: (tf: Transform, width: number) => ReactNode;
}) {
  const api = useEditorApi();
  const doc = useEditor((s) => s.doc);
  const view = useEditor((s) => s.view);
  const selection = useEditor((s) => s.selection);
  const playhead = useEditor((s) => s.playhead);
  const wrapRef = useRef<HTMLDivElement>(null);
  const svgRef = useRef<SVGSVGElement>(null);
  const [width, setWidth] = useState(900);
  const [box, setBox] = useState<BoxRect | null>(null);

  useEffect(() => {
    const el = wrapRef.current;
    if (!el) return;
    const ro = new ResizeObserver((entries) => setWidth(Math.max(320, Math.floor(entries[0].contentRect.width))));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const tf = useMemo(() => makeTransform(view, plotFor(width, height)), [view, width, height]);
  const curve = useMemo(() => prepareCurve(doc), [doc]);
  const keys: KeyView[] = useMemo(() => doc.keys.map((k, i) => ({ i, time: k.time, value: k.value })), [doc]);
  const bind = useCanvasGestures(svgRef, tf, setBox);

  const onFocusKey = useCallback((i: number) => {
    const s = api.getState();
    if (!s.selection.includes(i)) s.select([i], i);
    else if (s.primary !== i) s.select(s.selection, i);
  }, [api]);

  const onDoubleClick = useCallback((clientX: number, _clientY: number) => {
    const rect = svgRef.current!.getBoundingClientRect();
    const s = api.getState();
    let t = toT(tf, clientX - rect.left);
    if (s.snapping.frames) t = snapTime(t, s.doc.frameRate);
    const r = addKeyAt(s.doc, t);
    s.edit(() => r.doc, [r.index], r.index);
  }, [api, tf]);

  const band = useMemo(() => {
    if (!overlay) return null;
    const n = Math.max(2, Math.ceil(tf.plot.w / 2));
    const a = Math.max(tf.view.t0, curve.start), b = Math.min(tf.view.t1, curve.end);
    if (!(b > a)) return null;
    const ts = new Float64Array(n);
    for (let k = 0; k < n; k++) ts[k] = a + ((b - a) * k) / (n - 1);
    const vs = evaluateMany(curve, ts);
    const lo = vs.map((v) => v - overlay.tolerance);
    const hi = vs.map((v) => v + overlay.tolerance);
    return { ts, lo, hi };
  }, [overlay, curve, tf]);

  return (
    <div ref={wrapRef} className="relative w-full select-none">
      {/* the grid is its own layer: a drag repaints only the curve and the keys */}
      <svg width={width} height={height} aria-hidden="true" className="pointer-events-none absolute inset-0 rounded-md [will-change:transform]">
        <GridLayer tf={tf} frameRate={doc.frameRate} unit={doc.units.value} />
      </svg>
      <svg ref={svgRef} {...bind()} width={width} height={height} role="application" aria-roledescription="curve canvas"
        aria-label={`Curve ${doc.name}: ${doc.keys.length} keys. Tab to a key, arrows nudge it, Delete removes it; press ? for every shortcut.`}
        className="relative block touch-none rounded-md border border-grid-major/70 [will-change:transform] dark:border-night-line" data-testid="curve-canvas">
        <svg x={tf.plot.x} y={tf.plot.y} width={tf.plot.w} height={tf.plot.h} viewBox={`${tf.plot.x} ${tf.plot.y} ${tf.plot.w} ${tf.plot.h}`} overflow="hidden">
          <CurveLayer curve={curve} tf={tf} onDoubleClick={onDoubleClick} />
          {overlay && band && (
            <OverlayLayer tf={tf} name={overlay.name} dotTimes={overlay.dotTimes} dotValues={overlay.dotValues}
              bandTimes={band.ts} bandLo={band.lo} bandHi={band.hi} />
          )}
          <ScrubLine tf={tf} t={playhead} />
        </svg>
        <HandlesLayer curve={curve} tf={tf} selection={selection} />
        <KeysLayer keys={keys} tf={tf} selection={selection} unit={doc.units.value} onFocusKey={onFocusKey} />
        {box && (
          <rect x={Math.min(box.x0, box.x1)} y={Math.min(box.y0, box.y1)} width={Math.abs(box.x1 - box.x0)} height={Math.abs(box.y1 - box.y0)}
            className="pointer-events-none fill-vermilion/10 stroke-vermilion" strokeDasharray="4 3" data-testid="box-select" />
        )}
      </svg>
      {overlay && (
        <p className="pointer-events-none absolute font-mono text-[11px] text-[#2f5f8f] dark:text-[#8fb6dc]" style={{ left: tf.plot.x + 8, top: tf.plot.y + 4 }} data-testid="overlay-legend">
          {overlay.name} table: {overlay.entries} entries (dots{overlay.entries > overlay.dotTimes.length ? `, every ${Math.ceil(overlay.entries / overlay.dotTimes.length)}th shown` : ''}) · band: curve ± {overlay.tolerance.toExponential(2)} {doc.units.value} (drawn at least 3 px wide)
        </p>
      )}
      {children?.(tf, width)}
    </div>
  );
}
