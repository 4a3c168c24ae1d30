import { Link } from 'react-router-dom';
import type { PackDto } from '../../../../shared/schemas/packs';
import { Card } from '../../../components/card';

/** One pack in the library grid: name, slug, curve count, frame rate, tags; archived packs say so. */
export function PackCard({ pack }: { pack: PackDto }) {
  return (
    <Card className={`flex flex-col p-4 ${pack.archived ? 'opacity-70' : ''}`}>
      <h2 className="text-lg font-semibold">
        <Link to={`/packs/${pack.slug}`} className="underline-offset-2 hover:underline">
          {pack.name}
        </Link>
      </h2>
      <p className="font-mono text-xs text-ink/70 dark:text-paper/70">{pack.slug}</p>
      {pack.description ? <p className="mt-2 text-sm">{pack.description}</p> : null}
      <p className="mt-3 font-mono text-sm">
        {pack.curveCount} {pack.curveCount === 1 ? 'curve' : 'curves'} · {pack.frameRate} fps
      </p>
      <ul className="mt-2 flex flex-wrap gap-1" aria-label="Tags">
        {pack.tags.map((t) => (
          <li key={t} className="rounded border border-grid-major px-1.5 text-xs dark:border-night-line">{t}</li>
        ))}
        {pack.archived ? <li className="rounded border border-ink/40 px-1.5 text-xs font-medium">archived</li> : null}
      </ul>
    </Card>
  );
}
