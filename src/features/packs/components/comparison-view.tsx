import { useMemo } from 'react';
import type { CurveChange, VersionComparison } from '../../../../shared/schemas/versions';
import { formatBytes } from './artifacts-table';
import { evaluate, prepareCurve } from '../../../../shared/curve';
import { sparklinePaths } from './sparkline-path';

/** A comment pinned to a curve at a time, drawn on that curve's overlay (the page passes them in). */
export interface OverlayPin {
  curve: string;
  time: number;
  /** Who said what, for the marker's tooltip and the list under the plot. */
  label: string;
}

const W = 240, H = 60, PAD = 2;

/** Errors and deviations in scientific notation with 3 significant figures (BRIEF.md visual language). */
const sci = (v: number) => v.toExponential(2);

/** Both versions of a changed curve on one scale: the earlier dashed, the new one solid. */
function Overlay({ change, from, to, pins }: { change: CurveChange; from: number; to: number; pins: readonly OverlayPin[] }) {
  const [a, b] = useMemo(() => sparklinePaths([change.before, change.after], W, H, 96, PAD), [change]);
  // pins sit on the new version's curve, placed with the same time span and value range as the paths
  const marks = useMemo(() => {
    const t0 = Math.min(change.before.keys[0]!.time, change.after.keys[0]!.time);
    const t1 = Math.max(change.before.keys.at(-1)!.time, change.after.keys.at(-1)!.time);
    const span = t1 > t0 ? t1 - t0 : 1, range = b!.max - b!.min;
    const c = prepareCurve(change.after);
    return pins.map((p) => {
      const v = evaluate(c, p.time);
      return { ...p, x: PAD + ((W - 2 * PAD) * (p.time - t0)) / span, y: range > 0 ? PAD + (H - 2 * PAD) * (1 - (v - b!.min) / range) : H / 2 };
    });
  }, [change, pins, b]);
  return (
    <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`${change.name}: v${from} dashed, v${to} solid${marks.length ? `, ${marks.length} pinned comment${marks.length > 1 ? 's' : ''}` : ''}`} className="h-16 w-full max-w-sm" preserveAspectRatio="none">
      <path d={a!.d} fill="none" className="stroke-ink/50 dark:stroke-paper/50" strokeWidth="1.2" strokeDasharray="4 3" vectorEffect="non-scaling-stroke" />
      <path d={b!.d} fill="none" className="stroke-vermilion" strokeWidth="1.5" vectorEffect="non-scaling-stroke" />
      {marks.map((m, k) => (
        <g key={k} data-testid="overlay-pin">
          <title>{`t = ${m.time} s: ${m.label}`}</title>
          <line x1={m.x} x2={m.x} y1={0} y2={H} className="stroke-[#2f5f8f] dark:stroke-[#8fb6dc]" strokeWidth="1" strokeDasharray="2 2" vectorEffect="non-scaling-stroke" />
          <line x1={m.x - 4} x2={m.x + 4} y1={m.y} y2={m.y} className="stroke-[#2f5f8f] dark:stroke-[#8fb6dc]" strokeWidth="3" vectorEffect="non-scaling-stroke" />
        </g>
      ))}
    </svg>
  );
}

function delta(before: number | null, after: number | null, fmt: (n: number) => string): string {
  if (before === null || after === null) return after === null ? 'removed' : `new: ${fmt(after)}`;
  const d = after - before;
  return `${fmt(before)} → ${fmt(after)}${d === 0 ? '' : ` (${d > 0 ? '+' : '−'}${fmt(Math.abs(d))})`}`;
}

/** What changed between two versions: curve lists, per changed curve the max deviation and where, per target bytes and error. */
export function ComparisonView({ c, pins = [] }: { c: VersionComparison; pins?: readonly OverlayPin[] }) {
  return (
    <div className="space-y-4 text-sm">
      <p>
        Compared with v{c.from}: {c.added.length} added, {c.removed.length} removed, {c.changed.length} changed, {c.unchanged.length} unchanged.
      </p>
      {c.added.length ? <p><span className="font-medium">Added:</span> <span className="font-mono">{c.added.join(', ')}</span></p> : null}
      {c.removed.length ? <p><span className="font-medium">Removed:</span> <span className="font-mono">{c.removed.join(', ')}</span></p> : null}
      {c.changed.length ? (
        <ul aria-label="Changed curves" className="grid gap-3 sm:grid-cols-2">
          {c.changed.map((x) => (
            <li key={x.name} className="rounded border border-grid-minor p-3 dark:border-night-line">
              <h4 className="font-mono font-semibold">{x.name}</h4>
              <Overlay change={x} from={c.from} to={c.to} pins={pins.filter((p) => p.curve === x.name)} />
              {pins.some((p) => p.curve === x.name) && (
                <ul aria-label={`Pinned on ${x.name}`} className="text-xs text-[#2f5f8f] dark:text-[#8fb6dc]">
                  {pins.filter((p) => p.curve === x.name).map((p, k) => <li key={k}>pinned at t = {p.time} s — {p.label}</li>)}
                </ul>
              )}
              <p className="font-mono">max deviation {sci(x.maxDeviation)} {x.unit} at t = {x.at.toFixed(3)} s</p>
              <p className="text-xs text-ink/70 dark:text-paper/70">keys {x.keysBefore} → {x.keysAfter}; dense evaluation over {x.domain[0]}–{x.domain[1]} s</p>
            </li>
          ))}
        </ul>
      ) : null}
      <table aria-label="Targets compared" className="w-full text-left">
        <thead>
          <tr className="border-b border-grid-major dark:border-night-line">
            <th scope="col" className="py-1 pr-3">Target</th>
            <th scope="col" className="py-1 pr-3">Bytes</th>
            <th scope="col" className="py-1">Worst error / tolerance</th>
          </tr>
        </thead>
        <tbody>
          {c.targets.map((t) => (
            <tr key={t.profile} className="border-b border-grid-minor dark:border-night-line">
              <th scope="row" className="py-1 pr-3 font-medium">{t.profile}</th>
              <td className="py-1 pr-3 font-mono">{delta(t.bytesBefore, t.bytesAfter, formatBytes)}</td>
              <td className="py-1 font-mono">{delta(t.worstRatioBefore, t.worstRatioAfter, (n) => `${(n * 100).toFixed(1)} %`)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
