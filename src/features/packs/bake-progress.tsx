import { useEffect, useRef } from 'react';
import type { BakeDto } from '../../../shared/schemas/versions';
import { formMessage } from '../../lib/form-errors';
import { secondaryButton } from '../../components/form-controls';
import { useBakes, useRetryBake, useVersionsRefresh } from './api/bakes';

/** "Baking 3 of 5 targets" — the words that go with the bar (never the bar alone). */
export function bakeProgressText(b: Pick<BakeDto, 'state' | 'progress'>): string {
  const { done, total } = b.progress;
  if (b.state === 'queued') return `Queued: ${done} of ${total} ${total === 1 ? 'target' : 'targets'} baked`;
  if (b.state === 'baking') return `Baking ${done} of ${total} ${total === 1 ? 'target' : 'targets'}`;
  if (b.state === 'failed') return `Bake failed after ${done} of ${total} ${total === 1 ? 'target' : 'targets'}`;
  return `Baked ${total} of ${total} ${total === 1 ? 'target' : 'targets'}`;
}

function FailureText({ failure }: { failure: NonNullable<BakeDto['failure']> }) {
  return (
    <p className="text-sm text-brick dark:text-[#e07a6a]">
      {failure.target ? <>Target <span className="font-semibold">{failure.target}</span>{failure.curve ? <>, curve <span className="font-mono">{failure.curve}</span></> : null}: </> : null}
      {failure.reason}
    </p>
  );
}

function BakeRow({ bake, canRetry, onRetry, retrying }: { bake: BakeDto; canRetry: boolean; onRetry: () => void; retrying: boolean }) {
  const { done, total } = bake.progress;
  const percent = total ? Math.round((done / total) * 100) : 0;
  const text = bakeProgressText(bake);
  const failed = bake.state === 'failed';
  return (
    <li className="space-y-1 py-2">
      <div className="flex flex-wrap items-baseline gap-x-3">
        <span className="font-mono text-sm font-semibold">{failed ? 'failed' : bake.state}</span>
        <span className="flex-1 text-sm">{bake.changelog}</span>
        <span className="text-xs text-ink/70 dark:text-paper/70">{bake.proposedBy?.name ?? 'someone'} · <time dateTime={bake.createdAt}>{new Date(bake.createdAt).toLocaleString()}</time></span>
      </div>
      <div role="progressbar" aria-label={`Bake of “${bake.changelog}”`} aria-valuemin={0} aria-valuemax={total} aria-valuenow={done} aria-valuetext={text}
        className="h-2 w-full overflow-hidden rounded bg-grid-minor dark:bg-night-line">
        <div className={`h-full transition-[width] ${failed ? 'bg-brick' : 'bg-ink dark:bg-paper'}`} style={{ width: `${percent}%` }} />
      </div>
      <p className="font-mono text-xs">{text}</p>
      {failed && bake.failure ? <FailureText failure={bake.failure} /> : null}
      {failed && canRetry ? <button type="button" className={secondaryButton} onClick={onRetry} disabled={retrying}>{retrying ? 'Retrying…' : 'Retry'}</button> : null}
    </li>
  );
}

/**
 * The pack's proposals that are not versions yet: a progress bar per bake while it is queued or baking
 * (GET …/bakes, polled every second while one is unfinished), and a failed bake with its target, curve,
 * reason and a Retry button (versions.propose). When a bake finishes it leaves this list and the versions
 * list is refreshed, so the new version appears there.
 */
export function BakeProgress({ teamId, slug, canRetry }: { teamId: string; slug: string; canRetry: boolean }) {
  const bakes = useBakes(teamId, slug);
  const retry = useRetryBake(teamId, slug);
  const refreshVersions = useVersionsRefresh(teamId, slug);
  const openIds = useRef<Set<string>>(new Set());
  useEffect(() => {
    const now = new Set((bakes.data ?? []).filter((b) => b.state !== 'failed').map((b) => b.id));
    const finished = [...openIds.current].some((id) => !now.has(id));
    openIds.current = now;
    if (finished) void refreshVersions();
  }, [bakes.data, refreshVersions]);
  if (!bakes.data?.length) return null;
  return (
    <section aria-label="Bakes in progress" className="mb-3 rounded border border-grid-minor p-3 dark:border-night-line">
      <h3 className="text-sm font-semibold">Not yet versions</h3>
      {retry.isError ? <p role="alert" className="text-sm text-brick">{formMessage(retry.error)}</p> : null}
      <ul className="divide-y divide-grid-minor dark:divide-night-line">
        {bakes.data.map((b) => (
          <BakeRow key={b.id} bake={b} canRetry={canRetry} retrying={retry.isPending && retry.variables === b.id} onRetry={() => retry.mutate(b.id)} />
        ))}
      </ul>
    </section>
  );
}
