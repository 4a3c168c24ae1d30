import { useState } from 'react';
import { Card } from '../components/card';
import { FormAlert, secondaryButton } from '../components/form-controls';
import { formMessage } from '../lib/form-errors';
import { useActivity, type ActivityParams } from '../features/activity/api/get-activity';
import { ActivityFilters, type Filters } from '../features/activity/components/activity-filters';
import { ActivityTable } from '../features/activity/components/activity-table';
import { RequireSignIn } from './require-sign-in';
import { TeamNav } from './team-nav';

const PAGE = 25;

function TeamActivity({ teamId }: { teamId: string }) {
  const [filters, setFilters] = useState<Filters>({ type: '', pack: '', actor: '' });
  const [cursor, setCursor] = useState<Pick<ActivityParams, 'before' | 'after'>>({});
  const q = useActivity(teamId, { ...filters, ...cursor, limit: PAGE });
  const page = q.data;
  return (
    <div className="mt-6 space-y-4">
      <ActivityFilters teamId={teamId} value={filters} onChange={(f) => { setFilters(f); setCursor({}); }} />
      <Card className="p-4">
        {q.isPending ? <p className="text-sm">Loading the activity…</p>
          : q.isError ? <FormAlert message={formMessage(q.error)} />
          : page && page.items.length ? <div className="overflow-x-auto"><ActivityTable items={page.items} /></div>
          : <p className="text-sm">Nothing has happened here yet{filters.type || filters.pack || filters.actor ? ' that matches these filters' : ''}.</p>}
      </Card>
      <nav aria-label="Activity pages" className="flex items-center gap-3 text-sm">
        <button type="button" className={secondaryButton} disabled={!page?.newer} onClick={() => page?.newer && setCursor({ after: page.newer })}>Newer</button>
        <button type="button" className={secondaryButton} disabled={!page?.older} onClick={() => page?.older && setCursor({ before: page.older })}>Older</button>
        {page?.total !== undefined ? <span className="font-mono text-xs text-ink/70 dark:text-paper/70">{page.total} in all</span> : null}
      </nav>
    </div>
  );
}

/** /team/activity: who did what to which pack, version, curve, profile or channel in the current team. */
export function ActivityPage() {
  return (
    <RequireSignIn>
      {({ team }) => (
        <div>
          <title>Activity · Tangentry</title>
          <h1 className="text-2xl font-semibold tracking-tight">Activity</h1>
          <p className="mt-2 max-w-prose text-sm">Everything done in {team?.name ?? 'your team'}, newest first.</p>
          {team ? <TeamNav role={team.role} /> : null}
          {team ? <TeamActivity teamId={team.id} /> : <p className="mt-6">You are not in a team yet.</p>}
        </div>
      )}
    </RequireSignIn>
  );
}
