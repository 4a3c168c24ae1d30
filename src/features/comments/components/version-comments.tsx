import type { CommentDto } from '../../../../shared/schemas/comments';
import type { VersionDto } from '../../../../shared/schemas/versions';
import { Card } from '../../../components/card';
import { useComments, useVersionCurves } from '../api/comments';
import { CommentForm } from './comment-form';

function when(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

function Comment({ c }: { c: CommentDto }) {
  return (
    <li className="border-b border-grid-minor py-2 last:border-b-0 dark:border-night-line">
      <p className="text-xs text-ink/70 dark:text-paper/70">
        {c.time !== null ? <span className="mr-2 font-mono font-semibold text-ink dark:text-paper">t = {c.time.toFixed(3)} s</span> : c.curve ? <span className="mr-2">whole curve</span> : null}
        <span className="font-medium">{c.author?.name ?? 'a removed account'}</span> · <time dateTime={c.createdAt}>{when(c.createdAt)}</time>
      </p>
      <p className="mt-0.5 whitespace-pre-wrap text-sm">{c.body}</p>
    </li>
  );
}

/** Groups pinned comments per curve (in time order, whole-curve ones first); the rest are about the whole version. */
function grouped(comments: CommentDto[]): { whole: CommentDto[]; curves: [string, CommentDto[]][] } {
  const byCurve = new Map<string, CommentDto[]>();
  const whole: CommentDto[] = [];
  for (const c of comments) {
    if (!c.curve) whole.push(c);
    else byCurve.set(c.curve, [...(byCurve.get(c.curve) ?? []), c]);
  }
  const order = (a: CommentDto, b: CommentDto) => (a.time ?? -Infinity) - (b.time ?? -Infinity) || a.createdAt.localeCompare(b.createdAt);
  return { whole, curves: [...byCurve.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([k, v]) => [k, v.sort(order)]) };
}

/**
 * The version's comment thread: comments on the whole version, comments pinned to a curve listed per curve
 * with their time, and a form for any member of the team.
 */
export function VersionComments({ teamId, slug, version }: { teamId: string; slug: string; version: VersionDto }) {
  const comments = useComments(teamId, slug, version.number);
  const source = version.artifacts.find((a) => a.format === 'source');
  const sourceUrl = source ? `/api/teams/${teamId}/packs/${encodeURIComponent(slug)}/versions/${version.number}/artifacts/${source.id}` : null;
  const curves = useVersionCurves(sourceUrl);
  const g = grouped(comments.data ?? []);
  return (
    <Card className="mt-6 p-5">
      <section id="comments" aria-labelledby="comments-heading">
        <h2 id="comments-heading" className="text-lg font-semibold">Comments</h2>
        {comments.isPending ? <p className="mt-2 text-sm">Loading comments…</p>
          : comments.isError ? <p role="alert" className="mt-2 text-sm">Could not load the comments: {comments.error.message}</p>
          : !comments.data.length ? <p className="mt-2 text-sm">No comments yet.</p>
          : (
            <div className="mt-2 space-y-4">
              {g.whole.length ? (
                <div>
                  <h3 className="text-sm font-semibold">On the whole version</h3>
                  <ul aria-label="Comments on the whole version">{g.whole.map((c) => <Comment key={c.id} c={c} />)}</ul>
                </div>
              ) : null}
              {g.curves.map(([curve, list]) => (
                <div key={curve}>
                  <h3 className="text-sm font-semibold">On <span className="font-mono">{curve}</span></h3>
                  <ul aria-label={`Comments on ${curve}`}>{list.map((c) => <Comment key={c.id} c={c} />)}</ul>
                </div>
              ))}
            </div>
          )}
        <div className="mt-4 border-t border-grid-minor pt-4 dark:border-night-line">
          <CommentForm teamId={teamId} slug={slug} number={version.number} curves={curves.data ?? []} />
        </div>
      </section>
    </Card>
  );
}
