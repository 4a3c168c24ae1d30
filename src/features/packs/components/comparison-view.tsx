import { useMemo } from 'react';
import type { CurveChange, VersionComparison } from '../../../../shared/schemas/versions';
import { formatBytes } from './artifacts-table';
import { sparklinePaths } from './sparkline-path';

/** Errors and deviations in scientific notation with 3 significant figures (BRIEF.md visual language). */
const sci = (v: number) => v.toExponential(2);

/** Both versions of a changed curve on one scale: the earlier dashed, the new one solid. */
function Overlay({ change, from, to }: { change: CurveChange; from: number; to: number }) {
  const [a, b] = useMemo(() => sparklinePaths([change.before, change.after], 240, 60), [change]);
  return (
    <svg viewBox="0 0 240 60" role="img" aria-label={`${change.name}: v${from} dashed, v${to} solid`} className="h-16 w-full max-w-sm" preserveAspectRatio="none">
      <path d={a!.d} fill="none" className="stroke-ink/50 dark:stroke-paper/50" strokeWidth="1.2" strokeDasharray="4 3" vectorEffect="non-scaling-stroke" />
      <path d={b!.d} fill="none" className="stroke-vermilion" strokeWidth="1.5" vectorEffect="non-scaling-stroke" />
    </svg>
  );
}

function delta(before: number | null, after: number | null, fmt: (n: number) => string): string {
  if (before === null || after === null) return after === null ? 'removed' : `new: ${fmt(after)}`;
  const d = after - before;
  return `${fmt(before)} → ${fmt(after)}${d === 0 ? '' : ` (${d > 0 ? '+' : '−'}${fmt(Math.abs(d))})`}`;
}

/** What changed between two versions: curve lists, per changed curve the max deviation and where, per target bytes and error. */
export function ComparisonView({ c }: { c: VersionComparison }) {
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
              <Overlay change={x} from={c.from} to={c.to} />
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
