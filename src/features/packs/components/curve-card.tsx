import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { CurveDto, PackDto } from '../../../../shared/schemas/packs';
import { Card } from '../../../components/card';
import { secondaryButton } from '../../../components/form-controls';
import { Sparkline } from './sparkline';

const small = `${secondaryButton} px-2 py-1 text-xs`;

/** Segment kinds a curve uses, in its own order, each once. */
const kindsOf = (c: CurveDto) => [...new Set(c.document.segments.map((s) => s.kind))];

/**
 * A curve in the pack grid: sparkline, name, what it drives, segment kinds, keys and duration, tags.
 * With editing rights: buttons to move it one place earlier or later (the keyboard way to reorder) and
 * to move or copy it to another pack.
 */
export function CurveCard(props: {
  curve: CurveDto;
  index: number;
  count: number;
  canEdit: boolean;
  otherPacks: PackDto[];
  busy: boolean;
  onShift: (by: -1 | 1) => void;
  onTransfer: (mode: 'move' | 'copy', toPack: string) => void;
}) {
  const { curve, index, count, canEdit, otherPacks, busy } = props;
  const d = curve.document;
  const t0 = d.keys[0]!.time;
  const t1 = d.keys[d.keys.length - 1]!.time;
  const [to, setTo] = useState(otherPacks[0]?.slug ?? '');
  const flashy = d.drives === 'brightness' || d.drives === 'opacity';
  return (
    <Card className="flex flex-col p-3">
      <article aria-labelledby={`curve-${curve.id}`}>
        <Sparkline doc={d} />
        <h3 id={`curve-${curve.id}`} className="mt-2 font-mono text-sm font-semibold">{d.name}</h3>
        {/* relative to /packs/:pack: the editor on this curve (read only without editing rights) */}
        <Link to={`curves/${curve.id}`} className="text-xs underline" aria-label={`${canEdit ? 'Edit' : 'View'} in the editor: ${d.name}`}>
          {canEdit ? 'Edit in the editor' : 'View in the editor'}
        </Link>
        {d.description ? <p className="mt-1 text-xs text-ink/80 dark:text-paper/80">{d.description}</p> : null}
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-2 text-xs">
          <dt className="text-ink/65 dark:text-paper/65">drives</dt>
          <dd>{d.drives}{flashy ? ' (flash caution applies)' : ''}</dd>
          <dt className="text-ink/65 dark:text-paper/65">segments</dt>
          <dd>{kindsOf(curve).join(', ')}</dd>
          <dt className="text-ink/65 dark:text-paper/65">keys</dt>
          <dd className="font-mono">{d.keys.length} over {(t1 - t0).toFixed(3)} s</dd>
          <dt className="text-ink/65 dark:text-paper/65">revision</dt>
          <dd className="font-mono">{curve.revision}</dd>
        </dl>
        {d.tags.length ? (
          <ul className="mt-2 flex flex-wrap gap-1" aria-label="Tags">
            {d.tags.map((t) => <li key={t} className="rounded border border-grid-major px-1.5 text-xs dark:border-night-line">{t}</li>)}
          </ul>
        ) : null}
      </article>
      {canEdit ? (
        <div className="mt-3 flex flex-wrap items-center gap-1 border-t border-grid-minor pt-2 dark:border-night-line">
          <button type="button" className={small} disabled={busy || index === 0} onClick={() => props.onShift(-1)} aria-label={`Move earlier: ${d.name}`}>
            Move earlier
          </button>
          <button type="button" className={small} disabled={busy || index === count - 1} onClick={() => props.onShift(1)} aria-label={`Move later: ${d.name}`}>
            Move later
          </button>
          {otherPacks.length ? (
            <details className="w-full text-xs">
              <summary className="cursor-pointer py-1">Move or copy to another pack…</summary>
              <div className="flex flex-wrap items-end gap-1">
                <label className="text-xs">
                  Pack{' '}
                  <select value={to} onChange={(e) => setTo(e.target.value)} className="rounded border border-grid-major bg-paper px-1 py-0.5 dark:bg-night">
                    {otherPacks.map((p) => <option key={p.slug} value={p.slug}>{p.name}</option>)}
                  </select>
                </label>
                <button type="button" className={small} disabled={busy || !to} onClick={() => props.onTransfer('move', to)}>Move</button>
                <button type="button" className={small} disabled={busy || !to} onClick={() => props.onTransfer('copy', to)}>Copy</button>
              </div>
            </details>
          ) : null}
        </div>
      ) : null}
    </Card>
  );
}
