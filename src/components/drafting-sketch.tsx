/**
 * A decorative drawing in the brief's visual language: a two-segment cubic Hermite curve with its
 * keys (filled ink circles, the middle one selected with a vermilion ring) and slope handles
 * (hollow squares on thin lines), a uniform table of 11 entries (dots) and a translucent band for
 * an error envelope. It is an illustration, not data.
 *
 * Each segment is the cubic Hermite piece
 *   p(s) = h00(s)·y0 + h10(s)·w·m0 + h01(s)·y1 + h11(s)·w·m1,  s = (x − x0)/w, w = x1 − x0,
 *   h00 = 2s³ − 3s² + 1, h10 = s³ − 2s² + s, h01 = −2s³ + 3s², h11 = s³ − s²
 * (the standard Hermite basis; glTF 2.0 CUBICSPLINE uses the same form).
 */
const KEYS = [
  { x: 0, y: 0.08, m: 0 },
  { x: 0.4, y: 0.86, m: 1.2 },
  { x: 1, y: 0.7, m: 0 },
] as const;

const W = 480;
const H = 200;
const PAD = 16;
const BAND = 0.045;

function evaluate(x: number): number {
  const i = x < KEYS[1].x ? 0 : 1;
  const a = KEYS[i];
  const b = KEYS[i + 1];
  const w = b.x - a.x;
  const s = (x - a.x) / w;
  const s2 = s * s;
  const s3 = s2 * s;
  return (
    (2 * s3 - 3 * s2 + 1) * a.y + (s3 - 2 * s2 + s) * w * a.m + (-2 * s3 + 3 * s2) * b.y + (s3 - s2) * w * b.m
  );
}

const px = (x: number) => PAD + x * (W - 2 * PAD);
const py = (y: number) => H - PAD - y * (H - 2 * PAD);

function polyline(offset: number, steps = 96): string {
  const points: string[] = [];
  for (let k = 0; k <= steps; k++) {
    const x = k / steps;
    points.push(`${px(x).toFixed(1)},${py(evaluate(x) + offset).toFixed(1)}`);
  }
  return points.join(' ');
}

const curve = `M${polyline(0).replaceAll(' ', 'L')}`;
const band = `M${polyline(BAND).replaceAll(' ', 'L')}L${polyline(-BAND).split(' ').reverse().join('L')}Z`;
const table = Array.from({ length: 11 }, (_, k) => ({ x: px(k / 10), y: py(evaluate(k / 10)) }));

/** Handle arm length in drawing units, along the slope direction. */
const ARM = 44;
function handle(k: (typeof KEYS)[number]) {
  const dx = W - 2 * PAD;
  const dy = H - 2 * PAD;
  const len = Math.hypot(dx, k.m * dy);
  return { ux: (dx / len) * ARM, uy: (-k.m * dy / len) * ARM };
}

export function DraftingSketch({ className = '' }: { className?: string }) {
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className={className} aria-hidden="true" focusable="false">
      <path d={band} className="fill-grid-major/45 dark:fill-grid-major/25" />
      <path d={curve} fill="none" className="stroke-ink dark:stroke-paper" strokeWidth="2" strokeLinecap="round" />
      {table.map((p, k) => (
        <circle key={k} cx={p.x} cy={p.y} r="2.4" className="fill-card stroke-ink/70 dark:fill-night-card dark:stroke-paper/70" strokeWidth="1.2" />
      ))}
      {KEYS.map((k, i) => {
        const { ux, uy } = handle(k);
        const cx = px(k.x);
        const cy = py(k.y);
        const ends = [
          ...(i > 0 ? [{ x: cx - ux, y: cy - uy }] : []),
          ...(i < KEYS.length - 1 ? [{ x: cx + ux, y: cy + uy }] : []),
        ];
        return (
          <g key={i}>
            {ends.map((e, j) => (
              <g key={j}>
                <line x1={cx} y1={cy} x2={e.x} y2={e.y} className="stroke-ink/70 dark:stroke-paper/70" strokeWidth="1" />
                <rect x={e.x - 3.5} y={e.y - 3.5} width="7" height="7" className="fill-card stroke-ink dark:fill-night-card dark:stroke-paper" strokeWidth="1.2" />
              </g>
            ))}
            {i === 1 && <circle cx={cx} cy={cy} r="8" fill="none" className="stroke-vermilion" strokeWidth="1.8" />}
            <circle cx={cx} cy={cy} r="4.5" className="fill-ink dark:fill-paper" />
          </g>
        );
      })}
    </svg>
  );
}
