import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Card } from '../components/card';
import { roleCan, type Role } from '../../shared/schemas/roles';
import { useComparison, useVersion, useVersions, artifactUrl } from '../features/packs/api/versions';
import { ComparisonView } from '../features/packs/components/comparison-view';
import { ReviewForm } from '../features/packs/components/review-form';
import { ArtifactsTable } from '../features/packs/components/artifacts-table';
import { BakeSummaryTable } from '../features/packs/components/bake-summary-table';
import { RequireSignIn } from './require-sign-in';
import { VersionComments } from '../features/comments/components/version-comments';
import { useComments } from '../features/comments/api/comments';

/** /packs/:pack/versions/:number: an immutable pack version, its bake per target and its downloads. */
export function VersionPage() {
  const { pack = '', number = '' } = useParams();
  return <RequireSignIn>{({ team }) => (team ? <VersionOfTeam teamId={team.id} role={team.role} slug={pack} number={Number(number)} /> : <p>You are not in a team yet.</p>)}</RequireSignIn>;
}

function VersionOfTeam({ teamId, role, slug, number }: { teamId: string; role: Role; slug: string; number: number }) {
  const q = useVersion(teamId, slug, number);
  const all = useVersions(teamId, slug);
  const [chosen, setChosen] = useState<number | null>(null);
  // compare with the version before by default, or any other one the reader picks
  const against = chosen ?? (number > 1 ? number - 1 : null);
  const cmp = useComparison(teamId, slug, number, against);
  const comments = useComments(teamId, slug, number);
  // comments pinned to a curve at a time show on that curve's overlay
  const pins = (comments.data ?? []).flatMap((c) => (c.curve !== null && c.time !== null ? [{ curve: c.curve, time: c.time, label: `${c.author?.name ?? 'someone'}: ${c.body}` }] : []));
  const others = (all.data ?? []).filter((x) => x.number !== number);
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
        <h2 className="text-lg font-semibold">Review</h2>
        <p className="mt-1 text-sm">State: <span className="font-medium">{v.state}</span></p>
        {v.reviews.length ? (
          <ol aria-label="Reviews" className="mt-2 space-y-1 text-sm">
            {v.reviews.map((r) => (
              <li key={r.id}><span className="font-medium">{r.reviewer?.name ?? 'someone'}</span> {r.decision === 'approve' ? 'approved' : 'requested changes'}{r.comment ? `: ${r.comment}` : ''} · <time dateTime={r.createdAt}>{new Date(r.createdAt).toLocaleString()}</time></li>
            ))}
          </ol>
        ) : <p className="mt-1 text-sm">No reviews yet.</p>}
        {others.length ? (
          <label className="mt-4 flex items-center gap-2 text-sm">
            Compare with
            <select value={against ?? ''} onChange={(e) => setChosen(e.target.value ? Number(e.target.value) : null)} className="rounded border border-grid-major bg-paper px-2 py-1 font-mono dark:bg-night">
              {against === null ? <option value="">choose a version</option> : null}
              {others.map((o) => <option key={o.id} value={o.number}>v{o.number}</option>)}
            </select>
          </label>
        ) : null}
        <div className="mt-4">
          {against === null ? <p className="text-sm">v1 is the first version: every curve is new.</p>
            : cmp.isPending ? <p className="text-sm">Comparing with v{against}…</p>
            : cmp.isError ? <p role="alert">Could not compare: {cmp.error.message}</p>
            : <ComparisonView c={cmp.data} pins={pins} />}
        </div>
        {roleCan(role, 'versions.review') ? <div className="mt-4 border-t border-grid-minor pt-4 dark:border-night-line"><ReviewForm teamId={teamId} slug={slug} number={v.number} /></div> : null}
      </Card>
      <VersionComments teamId={teamId} slug={slug} version={v} />
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
