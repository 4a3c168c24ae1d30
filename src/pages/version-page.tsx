import { Link, useParams } from 'react-router-dom';
import { Card } from '../components/card';
import { useVersion, artifactUrl } from '../features/packs/api/versions';
import { ArtifactsTable } from '../features/packs/components/artifacts-table';
import { BakeSummaryTable } from '../features/packs/components/bake-summary-table';
import { RequireSignIn } from './require-sign-in';

/** /packs/:pack/versions/:number: an immutable pack version, its bake per target and its downloads. */
export function VersionPage() {
  const { pack = '', number = '' } = useParams();
  return <RequireSignIn>{({ team }) => (team ? <VersionOfTeam teamId={team.id} slug={pack} number={Number(number)} /> : <p>You are not in a team yet.</p>)}</RequireSignIn>;
}

function VersionOfTeam({ teamId, slug, number }: { teamId: string; slug: string; number: number }) {
  const q = useVersion(teamId, slug, number);
  if (q.isPending) return <p>Loading v{number}…</p>;
  if (q.isError) return <p role="alert">Could not load v{number} of “{slug}”: {q.error.message}</p>;
  const v = q.data;
  return (
    <div>
      <title>{`${slug} v${v.number} · Library · Tangentry`}</title>
      <p className="text-sm"><Link to="/packs" className="underline">Library</Link> / <Link to={`/packs/${slug}`} className="font-mono underline">{slug}</Link> / <span className="font-mono">v{v.number}</span></p>
      <h1 className="mt-1 text-2xl font-semibold tracking-tight">{slug} v{v.number}</h1>
      <p className="mt-1 max-w-prose">{v.changelog}</p>
      <p className="mt-1 text-sm text-ink/75 dark:text-paper/75">
        {v.state} · {v.curveCount} curves · proposed by {v.proposedBy?.name ?? 'someone'} on <time dateTime={v.createdAt}>{new Date(v.createdAt).toLocaleString()}</time>
      </p>
      <Card className="mt-6 p-5">
        <h2 className="text-lg font-semibold">Bake per target</h2>
        <div className="mt-3 overflow-x-auto"><BakeSummaryTable summary={v.bakeSummary} /></div>
      </Card>
      <Card className="mt-6 p-5">
        <h2 className="text-lg font-semibold">Downloads</h2>
        <p className="mt-1 text-sm">Each file is stored once under its SHA-256; check the checksum after download.</p>
        <div className="mt-3 overflow-x-auto">
          <ArtifactsTable artifacts={v.artifacts} href={(a) => artifactUrl(teamId, slug, v.number, a.id)} downloadName={(a) => `${slug}-v${v.number}-${a.fileName}`} />
        </div>
      </Card>
    </div>
  );
}
