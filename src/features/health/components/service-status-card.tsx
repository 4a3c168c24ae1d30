import { Card } from '../../../components/card';
import { StatusWord } from '../../../components/status-word';
import { HEALTH_PARTS, useHealth, type HealthPart, type HealthReport } from '../api/get-health';

const PART_LABEL: Record<HealthPart, { name: string; detail: string }> = {
  database: { name: 'Database', detail: 'PostgreSQL' },
  storage: { name: 'Storage', detail: 'S3-compatible object store' },
  mail: { name: 'Mail', detail: 'SMTP relay' },
};

const timeFormat = new Intl.DateTimeFormat('en-GB', {
  hour: '2-digit',
  minute: '2-digit',
  second: '2-digit',
  hour12: false,
});

function downParts(report: HealthReport): HealthPart[] {
  return HEALTH_PARTS.filter((part) => report[part] === 'down');
}

/** Live state of the server's services, from `GET /api/health`, polled while the page is open. */
export function ServiceStatusCard() {
  const health = useHealth();
  const check = health.data;

  let summary: { tone: 'pass' | 'over' | 'neutral'; word: string };
  if (health.isPending) summary = { tone: 'neutral', word: 'checking' };
  else if (health.isError) summary = { tone: 'over', word: 'unreachable' };
  else if (check && downParts(check.report).length === 0 && check.httpStatus === 200)
    summary = { tone: 'pass', word: 'all up' };
  else summary = { tone: 'over', word: 'degraded' };

  return (
    <Card className="w-full max-w-xl">
      <section aria-labelledby="service-status-heading">
        <div className="flex items-center justify-between gap-4 border-b border-grid-minor px-5 py-3 dark:border-night-line">
          <h2 id="service-status-heading" className="text-base font-semibold">
            Service status
          </h2>
          <div aria-live="polite" data-testid="service-status-summary">
            <StatusWord tone={summary.tone}>{summary.word}</StatusWord>
          </div>
        </div>

        {health.isError ? (
          <div className="px-5 py-4 text-sm">
            <p>
              No health report came back from <code className="text-[0.95em]">GET /api/health</code>, so the
              state of the database, storage and mail is unknown.
            </p>
            <p className="mt-2 font-mono text-xs text-ink/70 dark:text-paper/70">{health.error.message}</p>
          </div>
        ) : (
          <dl className="divide-y divide-grid-minor px-5 dark:divide-night-line">
            {HEALTH_PARTS.map((part) => {
              const state = check?.report[part];
              return (
                <div key={part} className="flex items-center justify-between gap-4 py-2.5">
                  <dt>
                    <span className="font-medium">{PART_LABEL[part].name}</span>
                    <span className="ml-2 text-sm text-ink/65 dark:text-paper/65">{PART_LABEL[part].detail}</span>
                  </dt>
                  <dd data-testid={`service-${part}`}>
                    {state === undefined ? (
                      <StatusWord tone="neutral">checking</StatusWord>
                    ) : (
                      <StatusWord tone={state === 'up' ? 'pass' : 'over'}>{state}</StatusWord>
                    )}
                  </dd>
                </div>
              );
            })}
          </dl>
        )}

        <div className="flex flex-wrap items-center justify-between gap-3 border-t border-grid-minor px-5 py-3 text-sm text-ink/70 dark:border-night-line dark:text-paper/70">
          <p className="font-mono text-xs tabular-nums">
            {check && !health.isError ? (
              <>
                HTTP {check.httpStatus} · {Math.round(check.roundTripMs)} ms · checked{' '}
                <time dateTime={new Date(check.checkedAt).toISOString()}>{timeFormat.format(check.checkedAt)}</time>
              </>
            ) : health.isError ? (
              <>no answer · checked {timeFormat.format(health.errorUpdatedAt || Date.now())}</>
            ) : (
              <>waiting for the first answer</>
            )}
          </p>
          <button
            type="button"
            onClick={() => void health.refetch()}
            disabled={health.isFetching}
            className="rounded border border-ink/30 px-3 py-1 text-sm font-medium text-ink hover:border-ink hover:bg-paper disabled:cursor-wait disabled:opacity-60 motion-safe:transition-colors dark:border-paper/30 dark:text-paper dark:hover:border-paper dark:hover:bg-night"
          >
            {health.isFetching ? 'Checking…' : 'Check now'}
          </button>
        </div>
      </section>
    </Card>
  );
}
