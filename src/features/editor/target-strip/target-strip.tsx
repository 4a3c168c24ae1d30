/**
 * The target strip: one row per target profile — entries, bytes, measured error against tolerance
 * as a small bar, and the verdict as a word with its colour and shape (never colour alone).
 * Bakes run in workers (./bake-runner.ts); the document is handed over at most once per animation
 * frame, so a drag never waits for a bake. A target whose bakes are slow (over LIVE_BAKE_MS) is
 * baked again when the drag ends, and its row says so.
 */
import { useEffect, useState, type ReactNode } from 'react';
import { useStore } from 'zustand';
import type { Profile } from '../../../../shared/bake';
import { StatusWord } from '../../../components/status-word';
import { useEditor, useEditorApi } from '../store/editor-context';
import type { BakeRunner } from './bake-runner';
import type { StripResult } from './bake-strip';
import { bytesLabel, NEAR_FRACTION, sci } from './verdict';

/** Hand the newest document to the runner once per animation frame. */
export function useBakeOnFrames(runner: BakeRunner) {
  const api = useEditorApi();
  useEffect(() => {
    let raf = 0;
    let last = api.getState().doc;
    let lastDrag = false;
    runner.submit(last);
    const unsub = api.subscribe((s) => {
      const dragging = s.drag !== null;
      if ((s.doc === last && dragging === lastDrag) || raf) return;
      raf = requestAnimationFrame(() => {
        raf = 0;
        const now = api.getState();
        last = now.doc;
        lastDrag = now.drag !== null;
        runner.submit(last, lastDrag);
      });
    });
    return () => { unsub(); if (raf) cancelAnimationFrame(raf); };
  }, [api, runner]);
}

const BAR_MAX = 1.25;

function ErrorBar({ ratio, verdict }: { ratio: number; verdict: 'pass' | 'near' | 'over' }) {
  const w = Math.min(ratio, BAR_MAX) / BAR_MAX;
  const fill = verdict === 'pass' ? 'bg-moss' : verdict === 'near' ? 'bg-amber' : 'bg-brick';
  return (
    <div className="relative h-2.5 w-28 rounded-sm bg-grid-minor/70 dark:bg-night-line" aria-hidden="true">
      <div className={`absolute inset-y-0 left-0 rounded-sm ${fill}`} style={{ width: `${w * 100}%` }} />
      <div className="absolute inset-y-[-2px] w-px bg-ink/50 dark:bg-paper/50" style={{ left: `${(NEAR_FRACTION / BAR_MAX) * 100}%` }} />
      <div className="absolute inset-y-[-3px] w-0.5 bg-ink dark:bg-paper" style={{ left: `${(1 / BAR_MAX) * 100}%` }} />
    </div>
  );
}

function spec(p: Profile): string {
  const tol = p.tolerance.mode === 'absolute' ? sci(p.tolerance.value) : `${sci(p.tolerance.value)} × range`;
  return `${p.output === 'css' ? 'CSS linear()' : `${p.encoding} · ${p.kernel} · ${p.layout}`} · tol ${tol}`;
}

function Row({ profile, result, stale, held, overlay, onOverlay }: {
  profile: Profile; result: StripResult | undefined; stale: boolean; held: boolean; overlay: boolean; onOverlay: () => void;
}) {
  let cells: ReactNode;
  if (!result) {
    cells = <td colSpan={4} className="px-2 py-1.5 text-sm text-ink/60 dark:text-paper/60">baking…</td>;
  } else if (!result.ok) {
    cells = (
      <>
        <td colSpan={3} className="max-w-[26rem] px-2 py-1.5 text-xs text-brick dark:text-[#e07a6a]" title={result.error}>
          <span className="line-clamp-2">no table: {result.error}</span>
        </td>
        <td className="px-2 py-1.5"><StatusWord tone="over">over</StatusWord></td>
      </>
    );
  } else {
    const ratio = result.maxError / result.tolerance;
    cells = (
      <>
        <td className="px-2 py-1.5 text-right font-mono text-sm" data-testid={`entries-${profile.name}`}>{result.entries}</td>
        <td className="px-2 py-1.5 text-right font-mono text-sm" data-testid={`bytes-${profile.name}`}>{bytesLabel(result.bytes)}</td>
        <td className="px-2 py-1.5">
          <div className="flex items-center gap-2">
            <ErrorBar ratio={ratio} verdict={result.verdict} />
            <span className="font-mono text-xs" data-testid={`error-${profile.name}`}>
              {sci(result.maxError)} / {sci(result.tolerance)}
            </span>
          </div>
        </td>
        <td className="px-2 py-1.5" data-testid={`verdict-${profile.name}`}>
          <StatusWord tone={result.verdict}>{result.verdict}</StatusWord>
          {result.withinCap === false && <span className="ml-1 text-xs text-brick">over byte cap</span>}
        </td>
      </>
    );
  }
  return (
    <tr className={`border-t border-grid-minor dark:border-night-line ${stale ? 'opacity-70' : ''}`} data-testid={`target-${profile.name}`} aria-busy={stale}>
      <th scope="row" className="px-2 py-1.5 text-left align-top">
        <div className="text-sm font-medium">
          {profile.name}
          {held && result && <span className="ml-2 text-[11px] font-normal text-ink/60 dark:text-paper/60">bakes when you let go ({Math.round(result.ms)} ms a bake)</span>}
        </div>
        <div className="font-mono text-[11px] font-normal text-ink/60 dark:text-paper/60">{spec(profile)}</div>
      </th>
      {cells}
      <td className="px-2 py-1.5">
        <button type="button" aria-pressed={overlay} onClick={onOverlay} disabled={!result?.ok}
          className={`rounded-sm border px-2 py-0.5 text-xs disabled:opacity-40 ${overlay ? 'border-vermilion text-vermilion' : 'border-grid-major dark:border-night-line'}`}>
          {overlay ? 'on canvas' : 'show on canvas'}
        </button>
      </td>
    </tr>
  );
}

export function TargetStrip({ runner, profiles, profilesLabel }: { runner: BakeRunner; profiles: readonly Profile[]; profilesLabel: string }) {
  useBakeOnFrames(runner);
  const results = useStore(runner.store, (s) => s.results);
  const stale = useStore(runner.store, (s) => s.stale);
  const held = useStore(runner.store, (s) => s.held);
  const overlay = useEditor((s) => s.overlay);
  const api = useEditorApi();
  const [showHelp, setShowHelp] = useState(false);
  return (
    <section aria-labelledby="targets-heading" className="min-w-0 flex-1">
      <div className="mb-1 flex items-baseline gap-3">
        <h2 id="targets-heading" className="text-sm font-semibold">Targets</h2>
        <span className="text-xs text-ink/60 dark:text-paper/60">{profilesLabel} · baked in this browser while you edit; the server's bake decides when a curve is saved</span>
        <button type="button" className="ml-auto text-xs underline decoration-dotted" aria-expanded={showHelp} onClick={() => setShowHelp(!showHelp)}>
          what pass / near / over mean
        </button>
      </div>
      {showHelp && (
        <p className="mb-2 max-w-prose text-xs text-ink/75 dark:text-paper/75">
          The bar is the measured maximum error of the baked table over the tolerance it was baked to (thin line: 80 %, thick
          line: 100 %). <b>pass</b>: at most 80 % of the tolerance. <b>near</b>: within tolerance but above 80 % — the baker
          picks the smallest table inside the budget, so adaptive tables often land here. <b>over</b>: above the tolerance,
          above the byte cap, or no table of that kind stays within it.
        </p>
      )}
      <div className="overflow-x-auto rounded-md border border-grid-major/70 bg-card dark:border-night-line dark:bg-night-card">
        <table className="w-full border-collapse">
          <thead>
            <tr className="text-left text-[11px] uppercase tracking-wide text-ink/60 dark:text-paper/60">
              <th scope="col" className="px-2 py-1 font-medium">target</th>
              <th scope="col" className="px-2 py-1 text-right font-medium">entries</th>
              <th scope="col" className="px-2 py-1 text-right font-medium">bytes</th>
              <th scope="col" className="px-2 py-1 font-medium">measured error / tolerance</th>
              <th scope="col" className="px-2 py-1 font-medium">verdict</th>
              <th scope="col" className="px-2 py-1 font-medium"><span className="sr-only">overlay</span></th>
            </tr>
          </thead>
          <tbody>
            {profiles.map((p) => (
              <Row key={p.name} profile={p} result={results[p.name]} stale={!!stale[p.name]} held={!!held[p.name]} overlay={overlay === p.name}
                onOverlay={() => api.getState().setOverlay(overlay === p.name ? null : p.name)} />
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
