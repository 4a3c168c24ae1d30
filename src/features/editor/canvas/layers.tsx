/**
 * The canvas's drawing layers: thin memoised components over the renderer functions
 * (./grid.ts, ./curve-path.ts, ./transform.ts). Each re-renders only when its own inputs change.
 */
import { memo, useMemo, useRef } from 'react';
import type { PreparedCurve } from '../../../../shared/curve';
import { bandPath, domainPath, outsidePaths } from './curve-path';
import { keyName } from './format';
import { buildGrid, tickLabel } from './grid';
import { handlePoint, toX, toY, type Transform } from './transform';

export const GridLayer = memo(function GridLayer({ tf, frameRate, unit }: { tf: Transform; frameRate: number; unit: string }) {
  const g = useMemo(() => buildGrid(tf, frameRate), [tf, frameRate]);
  const { x, y, w, h } = tf.plot;
  return (
    <g aria-hidden="true">
      <rect x={x} y={y} width={w} height={h} className="fill-card dark:fill-night-card" />
      {g.time.map((l) => (
        <line key={`t${l.major ? 'M' : 'm'}${l.value}`} x1={l.at} x2={l.at} y1={y} y2={y + h}
          className={l.major ? 'stroke-grid-major dark:stroke-[#3b5070]' : 'stroke-grid-minor dark:stroke-night-line'} strokeWidth={1} />
      ))}
      {g.value.map((l) => (
        <line key={`v${l.major ? 'M' : 'm'}${l.value}`} x1={x} x2={x + w} y1={l.at} y2={l.at}
          className={l.major ? 'stroke-grid-major dark:stroke-[#3b5070]' : 'stroke-grid-minor dark:stroke-night-line'} strokeWidth={1} />
      ))}
      <g className="fill-ink/75 font-mono text-[10.5px] dark:fill-paper/75">
        {g.time.filter((l) => l.major).map((l) => (
          <text key={`lt${l.value}`} x={l.at} y={y + h + 16} textAnchor="middle">{tickLabel(l.value, g.timeStep)}</text>
        ))}
        <text x={x + w} y={y + h + 27} textAnchor="end" className="fill-ink/55 dark:fill-paper/55">
          time (s){g.frames ? ` · grid: frames at ${frameRate} fps` : ''}
        </text>
        {g.value.filter((l) => l.major).map((l) => (
          <text key={`lv${l.value}`} x={x - 6} y={l.at + 3.5} textAnchor="end">{tickLabel(l.value, g.valueStep)}</text>
        ))}
        <text x={12} y={y + 4} transform={`rotate(-90 12 ${y + 4})`} textAnchor="end" className="fill-ink/55 dark:fill-paper/55">
          value ({unit || 'no unit'})
        </text>
      </g>
      <rect x={x} y={y} width={w} height={h} fill="none" className="stroke-grid-major dark:stroke-night-line" />
    </g>
  );
});

/** The curve: the domain solid, the outside rules dashed and faint, the domain's ends marked. */
export const CurveLayer = memo(function CurveLayer({ curve, tf, onDoubleClick }: {
  curve: PreparedCurve; tf: Transform; onDoubleClick: (clientX: number, clientY: number) => void;
}) {
  const d = domainPath(curve, tf);
  const out = outsidePaths(curve, tf);
  const { y, h } = tf.plot;
  const xs = toX(tf, curve.start), xe = toX(tf, curve.end);
  return (
    <g>
      <rect x={xs} y={y} width={Math.max(0, xe - xs)} height={h} className="fill-ink/[0.025] dark:fill-paper/[0.03]" aria-hidden="true" />
      {[xs, xe].map((x, i) => (
        <line key={i} x1={x} x2={x} y1={y} y2={y + h} strokeDasharray="2 4" className="stroke-ink/35 dark:stroke-paper/35" aria-hidden="true" />
      ))}
      <path d={out.before} fill="none" strokeWidth={1.5} strokeDasharray="5 5" className="stroke-ink/35 dark:stroke-paper/35" aria-hidden="true" />
      <path d={out.after} fill="none" strokeWidth={1.5} strokeDasharray="5 5" className="stroke-ink/35 dark:stroke-paper/35" aria-hidden="true" />
      <path d={d} fill="none" strokeWidth={2} strokeLinejoin="round" className="stroke-ink dark:stroke-paper" data-testid="curve-path" />
      {/* a wide invisible stroke over the curve catches the double-click that adds a key */}
      <path d={d} fill="none" stroke="transparent" strokeWidth={14} data-curve-hit=""
        onDoubleClick={(e) => onDoubleClick(e.clientX, e.clientY)} aria-hidden="true" />
    </g>
  );
});

export interface KeyView {
  i: number;
  time: number;
  value: number;
}

/**
 * One key: a filled ink circle (its transparent 12 px stroke is the hit area), a vermilion ring when
 * selected, a vermilion stroke when focused from the keyboard. Two elements at most: a 500-key curve
 * stays cheap to paint while a key moves.
 */
const KeyDot = memo(function KeyDot({ i, x, y, selected, name, onFocusKey }: {
  i: number; x: number; y: number; selected: boolean; name: string; onFocusKey: (i: number) => void;
}) {
  return (
    <g role="button" tabIndex={0} aria-label={name} aria-pressed={selected} data-key={i} data-testid={`key-${i}`}
      onFocus={() => onFocusKey(i)} className="cursor-grab outline-none [&:focus-visible>.dot]:stroke-vermilion">
      {selected && <circle cx={x} cy={y} r={7.5} fill="none" strokeWidth={2.25} stroke="#d2452b" />}
      <circle className="dot fill-ink dark:fill-paper" cx={x} cy={y} r={4.5} stroke="transparent" strokeWidth={12} />
    </g>
  );
});

/** Above this many keys, keys far outside the view are left out of the DOM. */
export const CULL_ABOVE = 2000;

export const KeysLayer = memo(function KeysLayer({ keys, tf, selection, unit, onFocusKey }: {
  keys: readonly KeyView[]; tf: Transform; selection: readonly number[]; unit: string; onFocusKey: (i: number) => void;
}) {
  const sel = useMemo(() => new Set(selection), [selection]);
  // accessible names kept per key index and rebuilt only for keys whose time or value changed: a drag
  // moves a few keys of many, and formatting every name on every move was most of this layer's work
  const names = useRef<{ time: number; value: number; unit: string; name: string }[]>([]);
  const nameOf = (k: KeyView): string => {
    const c = names.current[k.i];
    if (c && c.time === k.time && c.value === k.value && c.unit === unit) return c.name;
    const name = keyName(k.i, k.time, k.value, unit);
    names.current[k.i] = { time: k.time, value: k.value, unit, name };
    return name;
  };
  const { t0, t1, v0, v1 } = tf.view;
  const mt = (t1 - t0) * 0.02, mv = (v1 - v0) * 0.02;
  // every key stays in the document (and in the Tab order) up to CULL_ABOVE keys; past that, keys
  // far outside the view are not drawn, except selected ones
  const cull = keys.length > CULL_ABOVE;
  if (names.current.length > keys.length) names.current.length = keys.length;
  return (
    <g aria-label="Keys" role="group">
      {keys.map((k) =>
        !cull || sel.has(k.i) || (k.time >= t0 - mt && k.time <= t1 + mt && k.value >= v0 - mv && k.value <= v1 + mv) ? (
          <KeyDot key={k.i} i={k.i} x={toX(tf, k.time)} y={toY(tf, k.value)} selected={sel.has(k.i)}
            name={nameOf(k)} onFocusKey={onFocusKey} />
        ) : null,
      )}
    </g>
  );
});

/** Slope handles of the selected keys: hollow squares on thin lines. */
export const HandlesLayer = memo(function HandlesLayer({ curve, tf, selection }: {
  curve: PreparedCurve; tf: Transform; selection: readonly number[];
}) {
  const items = [];
  for (const i of selection.slice(0, 64)) {
    if (i >= curve.count) continue;
    const t = curve.times[i], v = curve.values[i];
    const kx = toX(tf, t), ky = toY(tf, v);
    for (const side of ['in', 'out'] as const) {
      if (side === 'in' && i === 0) continue;
      if (side === 'out' && i === curve.count - 1) continue;
      const p = handlePoint(tf, t, v, side === 'in' ? curve.slopesIn[i] : curve.slopesOut[i], side);
      items.push(
        <g key={`${i}${side}`} data-handle={side} data-handle-key={i} data-testid={`handle-${i}-${side}`} className="cursor-crosshair">
          <line x1={kx} y1={ky} x2={p.x} y2={p.y} strokeWidth={1} className="stroke-ink/70 dark:stroke-paper/70" />
          <rect x={p.x - 9} y={p.y - 9} width={18} height={18} fill="transparent" />
          <rect x={p.x - 4} y={p.y - 4} width={8} height={8} strokeWidth={1.4} className="fill-card stroke-ink dark:fill-night-card dark:stroke-paper" />
        </g>,
      );
    }
  }
  return <g aria-hidden="true">{items}</g>;
});

/**
 * A target's table (hollow dots at its entries) and its error envelope (the curve ± the tolerance, a
 * translucent band, drawn at least 3 px wide so a tight budget stays visible). Blueprint blue: a darker
 * shade of the grid, kept apart from the verdict colours and the vermilion of the selection.
 */
export const OverlayLayer = memo(function OverlayLayer({ tf, dotTimes, dotValues, bandTimes, bandLo, bandHi, name }: {
  tf: Transform; dotTimes: Float64Array; dotValues: Float64Array; bandTimes: Float64Array; bandLo: Float64Array; bandHi: Float64Array; name: string;
}) {
  const band = bandPath(tf, bandTimes, bandLo, bandHi, 3);
  const dots = [];
  const { t0, t1 } = tf.view;
  for (let k = 0; k < dotTimes.length; k++) {
    if (dotTimes[k] < t0 || dotTimes[k] > t1) continue;
    dots.push(<circle key={k} cx={toX(tf, dotTimes[k])} cy={toY(tf, dotValues[k])} r={3} strokeWidth={1.3} className="fill-card stroke-[#2f5f8f] dark:fill-night-card dark:stroke-[#8fb6dc]" />);
  }
  return (
    <g data-testid="table-overlay" aria-label={`${name} table overlay`} role="img">
      <path d={band} className="fill-[#2f5f8f]/20 stroke-none dark:fill-[#8fb6dc]/20" />
      {dots}
    </g>
  );
});

export function ScrubLine({ tf, t }: { tf: Transform; t: number }) {
  const x = toX(tf, t);
  if (x < tf.plot.x || x > tf.plot.x + tf.plot.w) return null;
  return (
    <line data-testid="scrub-line" x1={x} x2={x} y1={tf.plot.y} y2={tf.plot.y + tf.plot.h} strokeWidth={1.25}
      className="pointer-events-none stroke-vermilion/80" aria-hidden="true" />
  );
}
