import { Link } from 'react-router-dom';
import type { VersionDto } from '../../../../shared/schemas/versions';

/** The pack's versions, newest first: number, changelog, who proposed it, when, its state. */
export function VersionsList({ slug, versions }: { slug: string; versions: VersionDto[] }) {
  if (versions.length === 0) return <p className="text-sm">No versions yet.</p>;
  return (
    <ol aria-label="Versions" className="divide-y divide-grid-minor dark:divide-night-line">
      {versions.map((v) => (
        <li key={v.id} className="flex flex-wrap items-baseline gap-x-3 py-2">
          <Link to={`/packs/${slug}/versions/${v.number}`} className="font-mono font-semibold underline">v{v.number}</Link>
          <span className="flex-1 text-sm">{v.changelog}</span>
          <span className="text-xs text-ink/70 dark:text-paper/70">{v.state} · {v.proposedBy?.name ?? 'someone'} · <time dateTime={v.createdAt}>{new Date(v.createdAt).toLocaleString()}</time></span>
        </li>
      ))}
    </ol>
  );
}
