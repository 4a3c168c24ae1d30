import { ACTIVITY_TYPES, ACTIVITY_TYPE_LABEL } from '../../../../shared/schemas/activity';
import { usePackSlugs, usePeople } from '../api/filter-options';

export interface Filters {
  type: string;
  pack: string;
  actor: string;
}

const selectClass = 'mt-1 block rounded border border-grid-major bg-paper px-2 py-1 text-sm dark:border-night-line dark:bg-night';

/** Type, pack and person: each a select; changing one starts again from the newest page. */
export function ActivityFilters({ teamId, value, onChange }: { teamId: string; value: Filters; onChange: (f: Filters) => void }) {
  const people = usePeople(teamId);
  const packs = usePackSlugs(teamId);
  return (
    <form role="search" aria-label="Filter the activity" className="flex flex-wrap items-end gap-4" onSubmit={(e) => e.preventDefault()}>
      <div className="text-sm font-medium">
        <label htmlFor="activity-type">What</label>
        <select id="activity-type" className={selectClass} value={value.type} onChange={(e) => onChange({ ...value, type: e.target.value })}>
          <option value="">everything</option>
          {ACTIVITY_TYPES.map((t) => <option key={t} value={t}>{ACTIVITY_TYPE_LABEL[t]}</option>)}
        </select>
      </div>
      <div className="text-sm font-medium">
        <label htmlFor="activity-pack">Pack</label>
        <select id="activity-pack" className={`${selectClass} font-mono`} value={value.pack} onChange={(e) => onChange({ ...value, pack: e.target.value })}>
          <option value="">all packs</option>
          {(packs.data ?? []).map((p) => <option key={p.slug} value={p.slug}>{p.slug}</option>)}
        </select>
      </div>
      <div className="text-sm font-medium">
        <label htmlFor="activity-person">Person</label>
        <select id="activity-person" className={selectClass} value={value.actor} onChange={(e) => onChange({ ...value, actor: e.target.value })}>
          <option value="">anyone</option>
          {(people.data ?? []).map((m) => <option key={m.userId} value={m.userId}>{m.name}</option>)}
        </select>
      </div>
      {value.type || value.pack || value.actor ? (
        <button type="button" className="text-sm underline underline-offset-2" onClick={() => onChange({ type: '', pack: '', actor: '' })}>Clear filters</button>
      ) : null}
    </form>
  );
}
