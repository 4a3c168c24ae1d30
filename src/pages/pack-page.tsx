import { useMemo, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { roleCan, type Role } from '../../shared/schemas/roles';
import { DRIVES, SEGMENT_KINDS } from '../../shared/curve';
import { Card } from '../components/card';
import { FormAlert, inputClass, secondaryButton } from '../components/form-controls';
import { formMessage } from '../lib/form-errors';
import { usePack } from '../features/packs/api/get-pack';
import { usePacks } from '../features/packs/api/list-packs';
import { useSavePack } from '../features/packs/api/save-pack';
import { useReorderCurves, useTransferCurve } from '../features/packs/api/arrange-curves';
import { CurveCard } from '../features/packs/components/curve-card';
import { PackForm } from '../features/packs/components/pack-form';
import { NO_FILTER, matchesFilter, moved, placed, tagsOf, type CurveFilter } from '../features/packs/components/curve-filter';
import { CurveDnd, DraggableSlot, PackDropStrip, type DropResult } from '../features/packs/components/curve-drag';
import { useVersions } from '../features/packs/api/versions';
import { ProposeVersionForm } from '../features/packs/components/propose-version-form';
import { BakeProgress } from '../features/packs/bake-progress';
import { VersionsList } from '../features/packs/components/versions-list';
import { ChannelsPanel } from '../features/packs/components/channels-panel';
import { BulkUploadPanel } from '../features/packs/bulk-upload-panel';
import { RequireSignIn } from './require-sign-in';

/** /packs/:pack: one pack's curves as a grid of cards with sparklines, filters, reorder, move and copy. */
export function PackPage() {
  const { pack = '' } = useParams();
  return <RequireSignIn>{({ team }) => (team ? <PackOfTeam teamId={team.id} role={team.role} slug={pack} /> : <p>You are not in a team yet.</p>)}</RequireSignIn>;
}

function PackOfTeam({ teamId, role, slug }: { teamId: string; role: Role; slug: string }) {
  const q = usePack(teamId, slug);
  const all = usePacks(teamId);
  const [filter, setFilter] = useState<CurveFilter>(NO_FILTER);
  const [editing, setEditing] = useState(false);
  const save = useSavePack(teamId);
  const reorder = useReorderCurves(teamId, slug);
  const transfer = useTransferCurve(teamId, slug);
  const versions = useVersions(teamId, slug);
  const navigate = useNavigate();
  const curves = q.data?.curves ?? [];
  const tags = useMemo(() => tagsOf(curves.map((c) => c.document)), [curves]);
  if (q.isPending) return <p>Loading the pack…</p>;
  if (q.isError) return <p role="alert">Could not load pack “{slug}”: {q.error.message} <Link to="/packs" className="underline">Back to the library</Link></p>;
  const pack = q.data.pack;
  const canEdit = roleCan(role, 'curves.edit') && !pack.archived;
  const shown = curves.filter((c) => matchesFilter(c.document, filter));
  const filtered = shown.length !== curves.length;
  const others = (all.data ?? []).filter((p) => p.slug !== slug && !p.archived);
  const busy = reorder.isPending || transfer.isPending;
  const set = <K extends keyof CurveFilter>(k: K) => (e: { target: { value: string } }) => setFilter((f) => ({ ...f, [k]: e.target.value }));
  const error = reorder.error ?? transfer.error ?? save.error;
  return (
    <div>
      <title>{`${pack.name} · Library · Tangentry`}</title>
      <p className="text-sm"><Link to="/packs" className="underline">Library</Link> / <span className="font-mono">{pack.slug}</span></p>
      <div className="mt-1 flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold tracking-tight">{pack.name}{pack.archived ? ' (archived)' : ''}</h1>
          {pack.description ? <p className="mt-1 max-w-prose text-sm">{pack.description}</p> : null}
          <p className="mt-1 font-mono text-sm">{pack.curveCount} curves · {pack.frameRate} fps{pack.tags.length ? ` · ${pack.tags.join(', ')}` : ''}</p>
        </div>
        {roleCan(role, 'curves.edit') ? (
          <div className="flex gap-2">
            {!pack.archived ? <button type="button" className={secondaryButton} onClick={() => setEditing(true)}>Edit pack</button> : null}
            <button type="button" className={secondaryButton} disabled={save.isPending} onClick={() => save.mutate({ slug, body: { archived: !pack.archived } }, { onSuccess: () => q.refetch() })}>
              {pack.archived ? 'Restore pack' : 'Archive pack'}
            </button>
          </div>
        ) : null}
      </div>
      {editing ? (
        <Card className="mt-4 p-5">
          <PackForm teamId={teamId} editing={pack} onDone={() => { setEditing(false); void q.refetch(); }} />
        </Card>
      ) : null}
      <div className="mt-4"><FormAlert message={error ? formMessage(error) : null} /></div>

        <form role="search" aria-label="Filter curves" className="mt-4 grid gap-3 sm:grid-cols-4" onSubmit={(e) => e.preventDefault()}>
          <label className="text-sm font-medium">Name
            <input type="search" className={inputClass} value={filter.name} onChange={set('name')} placeholder="part of a name" />
          </label>
          <label className="text-sm font-medium">Tag
            <select className={inputClass} value={filter.tag} onChange={set('tag')}>
              <option value="">any tag</option>
              {tags.map((t) => <option key={t} value={t}>{t}</option>)}
            </select>
          </label>
          <label className="text-sm font-medium">Segment kind
            <select className={inputClass} value={filter.kind} onChange={set('kind')}>
              <option value="">any kind</option>
              {SEGMENT_KINDS.map((k) => <option key={k} value={k}>{k}</option>)}
            </select>
          </label>
          <label className="text-sm font-medium">Drives
            <select className={inputClass} value={filter.drives} onChange={set('drives')}>
              <option value="">anything</option>
              {DRIVES.map((k) => <option key={k} value={k}>{k}</option>)}
            </select>
          </label>
        </form>
      <p className="mt-2 text-sm" role="status">{filtered ? `${shown.length} of ${curves.length} curves match.` : `${curves.length} curves.`}{filtered && canEdit ? ' Clear the filter to reorder.' : ''}</p>

      <CurveDnd onDrop={(r: DropResult) => {
        const ids = curves.map((x) => x.id);
        if (r.kind === 'pack') transfer.mutate({ curveId: r.curveId, toPack: r.toPack, mode: 'move' });
        else reorder.mutate(placed(ids, ids.indexOf(r.curveId), ids.indexOf(r.onCurveId)));
      }}>
        {canEdit && !filtered ? <PackDropStrip packs={others} /> : null}
        <ul aria-label="Curves" className="mt-3 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {shown.map((c) => {
            const index = curves.indexOf(c);
            return (
              <DraggableSlot key={c.id} curveId={c.id} name={c.document.name} enabled={canEdit && !filtered && !busy}>
                <CurveCard
                  curve={c} index={index} count={curves.length} canEdit={canEdit && !filtered} otherPacks={others} busy={busy}
                  onShift={(by) => reorder.mutate(moved(curves.map((x) => x.id), index, by))}
                  onTransfer={(mode, toPack) => transfer.mutate({ curveId: c.id, toPack, mode })}
                />
              </DraggableSlot>
            );
          })}
        </ul>
      </CurveDnd>
      {canEdit ? <BulkUploadPanel teamId={teamId} slug={slug} /> : null}

      <Card className="mt-8 p-5">
        <h2 className="text-lg font-semibold">Versions</h2>
        <div className="mt-2"><BakeProgress teamId={teamId} slug={slug} canRetry={roleCan(role, 'versions.propose')} /></div>
        <div className="mt-2">
          {versions.isPending ? <p className="text-sm">Loading versions…</p> : versions.isError ? <p role="alert">Could not load the versions: {versions.error.message}</p> : <VersionsList slug={slug} versions={versions.data} />}
        </div>
        {roleCan(role, 'versions.propose') && !pack.archived && curves.length > 0 && versions.data ? (
          <div className="mt-4 border-t border-grid-minor pt-4 dark:border-night-line">
            <ProposeVersionForm teamId={teamId} slug={slug} nextNumber={(versions.data[0]?.number ?? 0) + 1} onProposed={(v) => navigate(`/packs/${slug}/versions/${v.number}`)} />
          </div>
        ) : null}
      </Card>
      <Card className="mt-6 p-5">
        <h2 className="text-lg font-semibold">Channels</h2>
        <p className="mt-1 text-sm">Named pointers build servers pull, such as shipping and nightly. Moving one to an approved version is a release; moving it back is a roll-back.</p>
        <div className="mt-3"><ChannelsPanel teamId={teamId} slug={slug} versions={versions.data ?? []} canRelease={roleCan(role, 'channels.release')} /></div>
      </Card>
    </div>
  );
}
