/**
 * Pointer work on the canvas with @use-gesture/react. What a drag does is decided at pointer-down
 * (a key: move the selection; a handle: turn a slope; background: box selection; middle button or
 * Alt: pan). Every move is computed from the pointer's offset to where the drag started, in the
 * transform the drag started with; the store turns that into one undo step (./store/editor-store.ts).
 * Escape cancels the running drag. Wheel zooms about the pointer (Shift: time only, Alt: value only);
 * a touch pinch zooms about its centre.
 */
import { useEffect, useRef, type RefObject } from 'react';
import { useGesture } from '@use-gesture/react';
import { useEditorApi } from '../store/editor-context';
import { panView, zoomView, type View } from '../store/view';
import { toT, toV, toX, toY, type Transform } from './transform';

export interface BoxRect { x0: number; y0: number; x1: number; y1: number }

type Intent =
  | { type: 'move'; anchor: number; tf: Transform; rect: DOMRect }
  | { type: 'handle'; index: number; side: 'in' | 'out'; tf: Transform; rect: DOMRect }
  | { type: 'box'; additive: boolean; start: number[]; tf: Transform; rect: DOMRect }
  | { type: 'pan'; view: View; tf: Transform; rect: DOMRect };

/**
 * Returns the bind function to spread on the <svg>. Handlers are bound as React props (not to the
 * element directly): a re-render in the middle of a pointer event must not unbind them.
 */
export function useCanvasGestures(svgRef: RefObject<SVGSVGElement | null>, tf: Transform, setBox: (b: BoxRect | null) => void) {
  const api = useEditorApi();
  const tfRef = useRef(tf);
  tfRef.current = tf;
  const intent = useRef<Intent | null>(null);

  // pointer-down decides what the drag will do (and selects a key at once, drag or not)
  const down = (e: PointerEvent) => {
    const svg = svgRef.current;
    if (!svg) return;
    const el = e.target as Element;
    const rect = svg.getBoundingClientRect();
    const s = api.getState();
    const tfNow = tfRef.current;
    const handle = el.closest('[data-handle]');
    const keyEl = el.closest('[data-key]');
    if (e.button === 1 || (e.altKey && e.button === 0 && !handle && !keyEl)) {
      e.preventDefault();
      intent.current = { type: 'pan', view: s.view, tf: tfNow, rect };
    } else if (e.button !== 0) {
      intent.current = null;
    } else if (handle) {
      intent.current = { type: 'handle', index: Number(handle.getAttribute('data-handle-key')), side: handle.getAttribute('data-handle') as 'in' | 'out', tf: tfNow, rect };
    } else if (keyEl) {
      const i = Number(keyEl.getAttribute('data-key'));
      const selected = s.selection.includes(i);
      if (e.shiftKey) {
        if (selected) { s.select(s.selection.filter((j) => j !== i)); intent.current = null; return; }
        s.select([...s.selection, i], i);
      } else if (!selected) s.select([i], i);
      else s.select(s.selection, i);
      intent.current = { type: 'move', anchor: i, tf: tfNow, rect };
    } else {
      if (!e.shiftKey) s.select([], null);
      intent.current = { type: 'box', additive: e.shiftKey, start: e.shiftKey ? s.selection : [], tf: tfNow, rect };
    }
  };

  // Escape cancels a running drag; the wheel zooms (a native listener: React's wheel listener is passive)
  useEffect(() => {
    const svg = svgRef.current;
    if (!svg) return;
    const key = (e: KeyboardEvent) => {
      if (e.key !== 'Escape' || !intent.current) return;
      if (api.getState().drag) api.getState().cancelDrag();
      if (intent.current.type === 'box') { setBox(null); api.getState().select(intent.current.start); }
      if (intent.current.type === 'pan') api.getState().setView(intent.current.view);
      intent.current = null;
      e.stopPropagation();
    };
    const wheel = (e: WheelEvent) => {
      e.preventDefault();
      const rect = svg.getBoundingClientRect();
      const t = tfRef.current;
      const x = e.clientX - rect.left, y = e.clientY - rect.top;
      const s = api.getState();
      const dy = e.deltaMode === 1 ? e.deltaY * 16 : e.deltaY;
      const f = Math.exp(-dy * (e.ctrlKey ? 0.01 : 0.0015)); // ctrl+wheel is a trackpad pinch
      s.setView(zoomView(s.view, f, toT(t, x), toV(t, y), e.shiftKey ? 'time' : e.altKey ? 'value' : 'both'));
    };
    window.addEventListener('keydown', key, true);
    svg.addEventListener('wheel', wheel, { passive: false });
    return () => { window.removeEventListener('keydown', key, true); svg.removeEventListener('wheel', wheel); };
  }, [api, svgRef, setBox]);

  return useGesture(
    {
      onPointerDown: ({ event }) => down(event as PointerEvent),
      onDrag: ({ first, last, xy: [cx, cy], initial: [ix, iy] }) => {
        const it = intent.current;
        if (!it) return;
        const s = api.getState();
        const { tf: t0, rect } = it;
        const x = cx - rect.left, y = cy - rect.top, x0 = ix - rect.left, y0 = iy - rect.top;
        switch (it.type) {
          case 'move':
            if (first) s.beginMove(it.anchor, s.selection);
            s.updateMove(toT(t0, x) - toT(t0, x0), toV(t0, y) - toV(t0, y0));
            if (last) s.endDrag();
            break;
          case 'handle':
            if (first) s.beginHandle(it.index, it.side);
            s.updateHandle(toT(t0, x), toV(t0, y));
            if (last) s.endDrag();
            break;
          case 'pan':
            s.setView(panView(it.view, toT(t0, x0) - toT(t0, x), toV(t0, y0) - toV(t0, y)));
            break;
          case 'box': {
            const b = { x0, y0, x1: x, y1: y };
            if (last) {
              const lx = Math.min(x0, x), hx = Math.max(x0, x), ly = Math.min(y0, y), hy = Math.max(y0, y);
              const inside: number[] = [];
              s.doc.keys.forEach((k, i) => {
                const kx = toX(t0, k.time), ky = toY(t0, k.value);
                if (kx >= lx && kx <= hx && ky >= ly && ky <= hy) inside.push(i);
              });
              s.select([...it.start, ...inside]);
              setBox(null);
            } else setBox(b);
            break;
          }
        }
        if (last) intent.current = null;
      },
      onPinch: ({ first, origin: [ox, oy], movement: [scale], memo }) => {
        const m = (first || !memo ? { view: api.getState().view, tf: tfRef.current, rect: svgRef.current!.getBoundingClientRect() } : memo) as
          { view: View; tf: Transform; rect: DOMRect };
        const x = ox - m.rect.left, y = oy - m.rect.top;
        api.getState().setView(zoomView(m.view, scale, toT(m.tf, x), toV(m.tf, y)));
        return m;
      },
    },
    {
      drag: { threshold: 3, pointer: { buttons: [1, 4] } },
      pinch: { scaleBounds: { min: 1e-3, max: 1e3 } },
    },
  );
}
