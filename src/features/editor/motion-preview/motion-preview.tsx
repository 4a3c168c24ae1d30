/**
 * Motion preview: an object moved, turned, scaled, faded or brightened by the curve (per the
 * document's `drives`), with play, pause, loop, speed and a scrub slider; the canvas draws the same
 * playhead as its scrub line. It plays once on opening unless the system asks for reduced motion
 * (WCAG 2.3.3) or the curve needs the flash caution (WCAG 2.3.1) — then only on request.
 */
import { useEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import { evaluate, prepareCurve, type CurveDocument, type PreparedCurve } from '../../../../shared/curve';
import { useEditor, useEditorApi } from '../store/editor-context';
import { short } from '../canvas/format';
import { countFlashes, FLASH_LIMIT, needsFlashCaution } from './flash-count';

function subscribeReduced(cb: () => void) {
  const m = window.matchMedia('(prefers-reduced-motion: reduce)');
  m.addEventListener('change', cb);
  return () => m.removeEventListener('change', cb);
}
export function usePrefersReducedMotion(): boolean {
  return useSyncExternalStore(subscribeReduced, () => window.matchMedia('(prefers-reduced-motion: reduce)').matches, () => true);
}

/** The value range the preview maps onto its box: the keys' values (a constant gets ±0.5). */
function valueRange(doc: CurveDocument): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (const k of doc.keys) { lo = Math.min(lo, k.value); hi = Math.max(hi, k.value); }
  return hi > lo ? [lo, hi] : [lo - 0.5, hi + 0.5];
}

function PreviewObject({ doc, curve, t }: { doc: CurveDocument; curve: PreparedCurve; t: number }) {
  const v = evaluate(curve, t);
  const [lo, hi] = valueRange(doc);
  const n = (v - lo) / (hi - lo); // 0..1 over the keys' range (may leave it on overshoot)
  const unit = doc.units.value.toLowerCase();
  const base = { width: 34, height: 34, rx: 4 };
  switch (doc.drives) {
    case 'position': {
      const x = 14 + Math.max(-0.2, Math.min(1.2, n)) * 112;
      return <rect x={x} y={43} {...base} className="fill-ink dark:fill-paper" />;
    }
    case 'rotation': {
      const deg = unit.startsWith('rad') ? (v * 180) / Math.PI : unit.startsWith('deg') || unit === '°' ? v : n * 360;
      return <rect x={63} y={43} {...base} transform={`rotate(${deg} 80 60)`} className="fill-ink dark:fill-paper" />;
    }
    case 'scale': {
      const s = unit.includes('%') ? v / 100 : v;
      return <rect x={63} y={43} {...base} transform={`translate(80 60) scale(${Math.max(0, Math.min(3, s))}) translate(-80 -60)`} className="fill-ink dark:fill-paper" />;
    }
    case 'opacity':
      return <rect x={55} y={35} width={50} height={50} rx={5} opacity={Math.max(0, Math.min(1, lo >= 0 && hi <= 1 ? v : n))} className="fill-ink dark:fill-paper" />;
    case 'brightness': {
      const b = Math.max(0, Math.min(1, lo >= 0 && hi <= 1 ? v : n));
      // from the night ink to a warm white
      const c = (a: number, z: number) => Math.round(a + (z - a) * b);
      return <circle cx={80} cy={60} r={26} fill={`rgb(${c(15, 255)} ${c(24, 244)} ${c(38, 214)})`} strokeWidth={1} className="stroke-ink dark:stroke-paper/60" />;
    }
    default: {
      const h = Math.max(0, Math.min(1, n)) * 80;
      return <rect x={70} y={100 - h} width={20} height={h} className="fill-ink dark:fill-paper" />;
    }
  }
}

export function MotionPreview() {
  const api = useEditorApi();
  const doc = useEditor((s) => s.doc);
  const playhead = useEditor((s) => s.playhead);
  const playing = useEditor((s) => s.playing);
  const reduced = usePrefersReducedMotion();
  const [loop, setLoop] = useState(false);
  const [speed, setSpeed] = useState(1);
  const curve = useMemo(() => prepareCurve(doc), [doc]);
  const flashes = useMemo(() => countFlashes(curve), [curve]);
  const caution = needsFlashCaution(doc.drives, flashes);
  const start = curve.start, end = curve.end;

  // play once on opening, unless reduced motion or a flash caution
  const autoplayed = useRef(false);
  useEffect(() => {
    if (autoplayed.current) return;
    autoplayed.current = true;
    if (!reduced && !caution && end > start) api.getState().setPlaying(true);
  }, [api, reduced, caution, start, end]);

  const settings = useRef({ loop, speed, start, end });
  settings.current = { loop, speed, start, end };
  useEffect(() => {
    if (!playing) return;
    let raf = 0;
    let last = performance.now();
    {
      const s = api.getState();
      if (s.playhead >= settings.current.end || s.playhead < settings.current.start) s.setPlayhead(settings.current.start);
    }
    const tick = (now: number) => {
      const { loop: lp, speed: sp, start: a, end: b } = settings.current;
      const s = api.getState();
      let t = s.playhead + ((now - last) / 1000) * sp;
      last = now;
      if (t >= b) {
        if (lp && b > a) t = a + ((t - a) % (b - a));
        else { s.setPlayhead(b); s.setPlaying(false); return; }
      }
      s.setPlayhead(t);
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf);
  }, [playing, api]);

  return (
    <section aria-labelledby="preview-heading" className="w-full shrink-0 lg:w-72">
      <h2 id="preview-heading" className="mb-1 text-sm font-semibold">Motion preview <span className="font-normal text-ink/60 dark:text-paper/60">· drives {doc.drives}</span></h2>
      <div className="rounded-md border border-grid-major/70 bg-card p-2 dark:border-night-line dark:bg-night-card">
        <svg viewBox="0 0 160 120" className="h-32 w-full rounded-sm bg-paper dark:bg-night" role="img"
          aria-label={`Preview at ${short(playhead)} s: value ${short(evaluate(curve, playhead))} ${doc.units.value}`} data-testid="preview-stage">
          <line x1={10} x2={150} y1={104} y2={104} className="stroke-grid-major" />
          <PreviewObject doc={doc} curve={curve} t={playhead} />
        </svg>
        <div className="mt-2 flex flex-wrap items-center gap-2 text-xs">
          <button type="button" onClick={() => api.getState().setPlaying(!playing)} data-testid="preview-play"
            className="rounded-sm border border-grid-major px-2 py-0.5 font-medium dark:border-night-line">{playing ? 'Pause' : 'Play'}</button>
          <label className="flex items-center gap-1"><input type="checkbox" checked={loop} onChange={(e) => setLoop(e.target.checked)} /> loop</label>
          <label className="flex items-center gap-1">speed
            <select value={speed} onChange={(e) => setSpeed(Number(e.target.value))} className="rounded-sm border border-grid-major bg-card px-0.5 dark:border-night-line dark:bg-night">
              {[0.25, 0.5, 1, 2].map((s) => <option key={s} value={s}>{s}×</option>)}
            </select>
          </label>
          <span className="ml-auto font-mono">{short(playhead)} s</span>
        </div>
        <label className="mt-1 block text-xs">
          <span className="sr-only">Scrub the preview time</span>
          <input type="range" className="w-full accent-[#d2452b]" min={start} max={end > start ? end : start + 1} step={1 / doc.frameRate / 4}
            value={playhead} onChange={(e) => { api.getState().setPlaying(false); api.getState().setPlayhead(Number(e.target.value)); }} />
        </label>
        {reduced && <p className="text-[11px] text-ink/60 dark:text-paper/60">Reduced motion is on: the preview waits for Play.</p>}
      </div>
      {caution && (
        <div role="alert" data-testid="flash-caution" className="mt-2 rounded-md border-2 border-amber bg-amber/10 p-2 text-xs leading-snug">
          <p className="font-semibold">⚠ Flash caution — WCAG 2.3.1 (Three Flashes or Below Threshold)</p>
          <p className="mt-1">
            This curve drives {doc.drives} and flashes {flashes.maxFlashes} times within one second (from {short(flashes.windowStart)} s);
            the limit is {FLASH_LIMIT}. Flashing can trigger seizures. The preview does not play by itself.
          </p>
          <p className="mt-1 text-ink/70 dark:text-paper/70">
            Counted as pairs of opposing changes of at least 10 % of the curve's value range — an approximation of the WCAG
            general-flash definition (no screen area or luminance model). Your studio's accessibility rules and the platform
            holders' certification requirements take precedence.
          </p>
        </div>
      )}
    </section>
  );
}
