import type { BakeSummary } from '../../../../shared/schemas/versions';
import { StatusWord } from '../../../components/status-word';
import { formatBytes } from './artifacts-table';

/**
 * The baker fills each target's error budget on purpose (the smallest table within tolerance), so a
 * worst ratio close to 100 % is the goal, not a warning: within ≤ 100 %; a failed curve or a byte cap
 * exceeded is over.
 */
function verdict(s: BakeSummary) {
  if (s.failed > 0 || s.overCap > 0 || s.worstRatio > 1) return { tone: 'over' as const, word: s.failed ? `${s.failed} failed` : s.overCap ? `${s.overCap} over cap` : 'over' };
  return { tone: 'pass' as const, word: 'within' };
}

/** Per target: curves, entries, bytes, the worst certified error as a share of the tolerance, and failures by name. */
export function BakeSummaryTable({ summary }: { summary: BakeSummary[] }) {
  return (
    <table className="w-full text-left text-sm" aria-label="Bake per target">
      <thead>
        <tr className="border-b border-grid-major dark:border-night-line">
          <th scope="col" className="py-1 pr-3">Target</th>
          <th scope="col" className="py-1 pr-3 text-right">Curves</th>
          <th scope="col" className="py-1 pr-3 text-right">Entries</th>
          <th scope="col" className="py-1 pr-3 text-right">Bytes</th>
          <th scope="col" className="py-1 pr-3 text-right">Worst error / tolerance</th>
          <th scope="col" className="py-1">Result</th>
        </tr>
      </thead>
      <tbody>
        {summary.map((s) => {
          const v = verdict(s);
          return (
            <tr key={s.profile} className="border-b border-grid-minor align-top dark:border-night-line">
              <th scope="row" className="py-1 pr-3 font-medium">{s.profile}</th>
              <td className="py-1 pr-3 text-right font-mono">{s.curves - s.failed}/{s.curves}</td>
              <td className="py-1 pr-3 text-right font-mono">{s.entries}</td>
              <td className="py-1 pr-3 text-right font-mono">{formatBytes(s.bytes)}</td>
              <td className="py-1 pr-3 text-right font-mono">{(s.worstRatio * 100).toFixed(1)} %</td>
              <td className="py-1">
                <StatusWord tone={v.tone}>{v.word}</StatusWord>
                {s.failures.map((f) => <p key={f.curve} className="mt-1 text-xs">{f.curve}: {f.error}</p>)}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
